/** Error codes of report sign-off, revisions and report files. */
export enum SignoffError {
  ReportNotFound = 'SIGNOFF_REPORT_NOT_FOUND',
  RevisionNotFound = 'SIGNOFF_REVISION_NOT_FOUND',
  NotSignedYet = 'SIGNOFF_NOT_SIGNED_YET',
  NothingToSign = 'SIGNOFF_NOTHING_TO_SIGN',
  AlreadySigned = 'SIGNOFF_ALREADY_SIGNED',
  ContentChanged = 'SIGNOFF_CONTENT_CHANGED',
  WrongPassword = 'SIGNOFF_WRONG_PASSWORD',
  AccountLocked = 'SIGNOFF_ACCOUNT_LOCKED',
  WrongMeaning = 'SIGNOFF_WRONG_MEANING',
  FileCorrupted = 'SIGNOFF_FILE_CORRUPTED',
}
