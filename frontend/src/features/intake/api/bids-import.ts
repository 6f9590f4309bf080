import type { BidsImportPreview } from '@gyre/shared';
import type { UploadOptions } from '../../../lib/api-client';
import { postStudyImport, refusedOutcomeOf, useStudyImport } from './study-import';

/** The 422 of an import with a problem: nothing was stored, the preview says why. */
const BIDS_FILES_INVALID = 'BIDS_IMPORT_FILES_INVALID';

/** A dropped BIDS folder (each file with its path in it) or one zip of it. */
export type BidsSource = { kind: 'folder'; files: File[] } | { kind: 'zip'; file: File };

export interface BidsImportInput {
  studyId: string;
  source: BidsSource;
  createParticipants: boolean;
  /** YYYY-MM-DD for new visits when the folder has no scans.tsv; '' for none. */
  visitDate: string;
  dryRun: boolean;
}

/** The path a folder drop gives a file (`webkitRelativePath`), else its name. */
export function pathOf(file: File): string {
  return file.webkitRelativePath === '' ? file.name : file.webkitRelativePath;
}

/** The preview a refused import carries in `details.preview`, when it has that shape. */
export function previewOfError(error: unknown): BidsImportPreview | null {
  return refusedOutcomeOf<BidsImportPreview>(error, BIDS_FILES_INVALID, 'preview', (preview) =>
    Array.isArray(preview.files),
  );
}

/**
 * `POST /api/studies/:studyId/bids-imports[?dryRun=true]` (multipart: the form fields, then
 * every `files` part named by its path in the folder, or one `archive` part). A dry run answers
 * 200 with the preview; an import 201, or 422 `BIDS_IMPORT_FILES_INVALID` with the preview.
 */
function bidsImport(input: BidsImportInput, options: UploadOptions): Promise<BidsImportPreview> {
  const form = new FormData();
  if (input.createParticipants) form.append('createParticipants', 'true');
  if (input.visitDate !== '') form.append('visitDate', input.visitDate);
  if (input.source.kind === 'zip')
    form.append('archive', input.source.file, input.source.file.name);
  else for (const file of input.source.files) form.append('files', file, pathOf(file));
  return postStudyImport(input.studyId, 'bids-imports', form, input.dryRun, options);
}

/** What an import can add to: participants, visits (and their recordings). */
const REFRESHED = ['/api/visits', '/api/participants', '/api/recordings'] as const;

/** An EEG-BIDS import; after one, the participant, visit, due and recording lists are read again. */
export function useBidsImport() {
  return useStudyImport(bidsImport, REFRESHED);
}
