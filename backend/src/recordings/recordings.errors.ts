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
