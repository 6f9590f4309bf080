/** Error codes of uploads and recordings. */
export enum RecordingsError {
  VisitNotFound = 'RECORDING_VISIT_NOT_FOUND',
  NotFound = 'RECORDING_NOT_FOUND',
  Duplicate = 'RECORDING_DUPLICATE',
  TooLarge = 'RECORDING_TOO_LARGE',
  FormInvalid = 'RECORDING_FORM_INVALID',
  Rejected = 'RECORDING_REJECTED',
  NotRetryable = 'RECORDING_NOT_RETRYABLE',
  Busy = 'RECORDING_BUSY',
}
