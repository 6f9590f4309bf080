import { apiDownload, saveBlob } from '../../../lib/api-client';

export type StudyExportKind = 'results-csv' | 'bids-zip';

/** `GET /api/studies/:studyId/results.csv` and `…/export.zip` (both audited by the server). */
export function studyExportPath(studyId: string, kind: StudyExportKind): string {
  const file = kind === 'results-csv' ? 'results.csv' : 'export.zip';
  return `/api/studies/${encodeURIComponent(studyId)}/${file}`;
}

/** Downloads an export with the session's token and hands it to the browser as a save. */
export async function downloadStudyExport(studyId: string, kind: StudyExportKind): Promise<void> {
  const { blob, fileName } = await apiDownload(studyExportPath(studyId, kind));
  saveBlob(
    blob,
    fileName ?? (kind === 'results-csv' ? 'gyre-results.csv' : 'gyre-derivatives.zip'),
  );
}
