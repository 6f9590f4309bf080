import { apiDownload, saveBlob } from '../../../lib/api-client';

export type StudyExportKind = 'results-csv' | 'conditions-csv' | 'bids-zip';

const FILES: Record<StudyExportKind, { path: string; fallback: string }> = {
  'results-csv': { path: 'results.csv', fallback: 'gyre-results.csv' },
  'conditions-csv': { path: 'conditions.csv', fallback: 'gyre-conditions.csv' },
  'bids-zip': { path: 'export.zip', fallback: 'gyre-derivatives.zip' },
};

/**
 * `GET /api/studies/:studyId/results.csv`, `…/conditions.csv` and `…/export.zip` (each audited
 * by the server).
 */
export function studyExportPath(studyId: string, kind: StudyExportKind): string {
  return `/api/studies/${encodeURIComponent(studyId)}/${FILES[kind].path}`;
}

/** Downloads an export with the session's token and hands it to the browser as a save. */
export async function downloadStudyExport(studyId: string, kind: StudyExportKind): Promise<void> {
  const { blob, fileName } = await apiDownload(studyExportPath(studyId, kind));
  saveBlob(blob, fileName ?? FILES[kind].fallback);
}
