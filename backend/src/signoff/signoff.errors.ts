import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

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

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const SIGNOFF_ERROR_KINDS = {
  [SignoffError.ReportNotFound]: ErrorKind.NotFound,
  [SignoffError.RevisionNotFound]: ErrorKind.NotFound,
  [SignoffError.NotSignedYet]: ErrorKind.NotFound,
  [SignoffError.NothingToSign]: ErrorKind.Conflict,
  [SignoffError.AlreadySigned]: ErrorKind.Conflict,
  [SignoffError.ContentChanged]: ErrorKind.Conflict,
  [SignoffError.WrongPassword]: ErrorKind.Unprocessable,
  [SignoffError.AccountLocked]: ErrorKind.Locked,
  [SignoffError.WrongMeaning]: ErrorKind.BadInput,
  [SignoffError.FileCorrupted]: ErrorKind.Unavailable,
} as const satisfies Record<SignoffError, ErrorKind>;

/** A GyreException of this module: the kind comes from SIGNOFF_ERROR_KINDS. */
export const signoffError = errorFactory(SIGNOFF_ERROR_KINDS);
