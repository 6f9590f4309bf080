import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of uploads and recordings. */
export enum RecordingsError {
  VisitNotFound = 'RECORDING_VISIT_NOT_FOUND',
  NotFound = 'RECORDING_NOT_FOUND',
  Duplicate = 'RECORDING_DUPLICATE',
  TooLarge = 'RECORDING_TOO_LARGE',
  FormInvalid = 'RECORDING_FORM_INVALID',
  Rejected = 'RECORDING_REJECTED',
  /** The file looks like the other kind and the technician did not confirm the kind chosen. */
  KindUnconfirmed = 'RECORDING_KIND_UNCONFIRMED',
  /** The visit already has a current recording of this kind: replace it explicitly. */
  KindTaken = 'RECORDING_KIND_TAKEN',
  ReplacementInvalid = 'RECORDING_REPLACEMENT_INVALID',
  NotRetryable = 'RECORDING_NOT_RETRYABLE',
  NotComputable = 'RECORDING_NOT_COMPUTABLE',
  AlreadyQueued = 'RECORDING_ALREADY_QUEUED',
  IllegalTransition = 'RECORDING_ILLEGAL_TRANSITION',
  FileMissing = 'RECORDING_FILE_MISSING',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const RECORDINGS_ERROR_KINDS = {
  [RecordingsError.VisitNotFound]: ErrorKind.NotFound,
  [RecordingsError.NotFound]: ErrorKind.NotFound,
  [RecordingsError.Duplicate]: ErrorKind.Conflict,
  [RecordingsError.TooLarge]: ErrorKind.PayloadTooLarge,
  [RecordingsError.FormInvalid]: ErrorKind.BadInput,
  [RecordingsError.Rejected]: ErrorKind.Unprocessable,
  [RecordingsError.KindUnconfirmed]: ErrorKind.Unprocessable,
  [RecordingsError.KindTaken]: ErrorKind.Conflict,
  [RecordingsError.ReplacementInvalid]: ErrorKind.Conflict,
  [RecordingsError.NotRetryable]: ErrorKind.Conflict,
  [RecordingsError.NotComputable]: ErrorKind.Conflict,
  [RecordingsError.AlreadyQueued]: ErrorKind.Conflict,
  [RecordingsError.IllegalTransition]: ErrorKind.Conflict,
  [RecordingsError.FileMissing]: ErrorKind.NotFound,
} as const satisfies Record<RecordingsError, ErrorKind>;

/** A GyreException of this module: the kind comes from RECORDINGS_ERROR_KINDS. */
export const recordingsError = errorFactory(RECORDINGS_ERROR_KINDS);
