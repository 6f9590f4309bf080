import { apiDownload } from '../../../lib/api-client';

/** `GET /api/visits/:visitId/report/preview`: the draft PDF as it would be signed now. */
export const reportPreviewPath = (visitId: string) =>
  `/api/visits/${encodeURIComponent(visitId)}/report/preview`;

export async function fetchReportPreview(visitId: string): Promise<Blob> {
  const { blob } = await apiDownload(reportPreviewPath(visitId));
  return blob;
}
