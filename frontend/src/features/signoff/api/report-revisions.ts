import type { ReportRevisionView } from '@gyre/shared';
import { apiDownload, saveBlob, withQuery } from '../../../lib/api-client';
import { usePage } from '../../../lib/use-page';
import { useRead } from '../../../lib/use-read';

/** `GET /api/report-revisions`: signed revisions in scope (a coordinator: their site's). */
export function reportRevisionsKey(page: number, pageSize: number): string {
  return withQuery('/api/report-revisions', { page, pageSize, sort: 'signedAt', order: 'desc' });
}

export function useReportRevisions(page: number, pageSize: number) {
  return usePage<ReportRevisionView>(reportRevisionsKey(page, pageSize));
}

/** `GET /api/report-revisions/:id`: one revision (the e-mail's link names it). */
export const reportRevisionKey = (revisionId: string) =>
  `/api/report-revisions/${encodeURIComponent(revisionId)}`;

export function useReportRevision(revisionId: string | null) {
  return useRead<ReportRevisionView>(revisionId === null ? null : reportRevisionKey(revisionId));
}

/** `GET /api/report-revisions/:id/file`: the signed PDF, saved under the server's file name. */
export async function downloadRevision(revision: ReportRevisionView): Promise<void> {
  const { blob, fileName } = await apiDownload(`${reportRevisionKey(revision.id)}/file`);
  saveBlob(blob, fileName ?? `gyre-report-${revision.participantCode}-r${revision.revision}.pdf`);
}
