import { apiDownload, saveBlob } from '../../../lib/api-client';

/** `GET /api/reports/:id/file`: the signed report's PDF. */
export function reportFilePath(reportId: string): string {
  return `/api/reports/${encodeURIComponent(reportId)}/file`;
}

export async function downloadReport(reportId: string, fallbackName: string): Promise<void> {
  const { blob, fileName } = await apiDownload(reportFilePath(reportId));
  saveBlob(blob, fileName ?? fallbackName);
}
