import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of bulk uploads. */
export enum BulkUploadsError {
  /** The multipart form is not what a bulk upload sends (400 naming the part). */
  FormInvalid = 'BULK_UPLOAD_FORM_INVALID',
  /** The manifest is not a CSV with the expected columns (400 naming the line or column). */
  ManifestInvalid = 'BULK_UPLOAD_MANIFEST_INVALID',
  /** More rows than BULK_UPLOAD_MAX_ROWS (422 naming the limit). */
  TooManyRows = 'BULK_UPLOAD_TOO_MANY_ROWS',
  /** More bytes than BULK_UPLOAD_MAX_BYTES, or a file beyond UPLOAD_MAX_BYTES (413). */
  TooLarge = 'BULK_UPLOAD_TOO_LARGE',
  /** At least one row (or an unlisted file) failed: nothing was imported (422, details.report). */
  RowsInvalid = 'BULK_UPLOAD_ROWS_INVALID',
  /** Another upload changed a visit while the import was written: nothing was imported (409). */
  Conflict = 'BULK_UPLOAD_CONFLICT',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const BULK_UPLOADS_ERROR_KINDS = {
  [BulkUploadsError.FormInvalid]: ErrorKind.BadInput,
  [BulkUploadsError.ManifestInvalid]: ErrorKind.BadInput,
  [BulkUploadsError.TooManyRows]: ErrorKind.Unprocessable,
  [BulkUploadsError.TooLarge]: ErrorKind.PayloadTooLarge,
  [BulkUploadsError.RowsInvalid]: ErrorKind.Unprocessable,
  [BulkUploadsError.Conflict]: ErrorKind.Conflict,
} as const satisfies Record<BulkUploadsError, ErrorKind>;

/** A GyreException of this module: the kind comes from BULK_UPLOADS_ERROR_KINDS. */
export const bulkUploadsError = errorFactory(BULK_UPLOADS_ERROR_KINDS);
