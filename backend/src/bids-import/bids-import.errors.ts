import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of the EEG-BIDS import. */
export enum BidsImportError {
  /** The multipart form is not what an import sends (400 naming the part or field). */
  FormInvalid = 'BIDS_IMPORT_FORM_INVALID',
  /** A path leaves the folder (`..`, absolute, control characters): 400 naming it. */
  PathUnsafe = 'BIDS_IMPORT_PATH_UNSAFE',
  /** The zip cannot be read (400). */
  ArchiveInvalid = 'BIDS_IMPORT_ARCHIVE_INVALID',
  /** Beyond BULK_UPLOAD_MAX_BYTES, or a recording beyond UPLOAD_MAX_BYTES (413). */
  TooLarge = 'BIDS_IMPORT_TOO_LARGE',
  /** At least one file or the upload as a whole has a problem: nothing imported (422). */
  FilesInvalid = 'BIDS_IMPORT_FILES_INVALID',
  /** Another upload changed a visit or participant meanwhile: nothing imported (409). */
  Conflict = 'BIDS_IMPORT_CONFLICT',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const BIDS_IMPORT_ERROR_KINDS = {
  [BidsImportError.FormInvalid]: ErrorKind.BadInput,
  [BidsImportError.PathUnsafe]: ErrorKind.BadInput,
  [BidsImportError.ArchiveInvalid]: ErrorKind.BadInput,
  [BidsImportError.TooLarge]: ErrorKind.PayloadTooLarge,
  [BidsImportError.FilesInvalid]: ErrorKind.Unprocessable,
  [BidsImportError.Conflict]: ErrorKind.Conflict,
} as const satisfies Record<BidsImportError, ErrorKind>;

/** A GyreException of this module: the kind comes from BIDS_IMPORT_ERROR_KINDS. */
export const bidsImportError = errorFactory(BIDS_IMPORT_ERROR_KINDS);
