import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

export enum StudiesError {
  NotFound = 'STUDY_NOT_FOUND',
  CodeTaken = 'STUDY_CODE_TAKEN',
  ReasonRequired = 'STUDY_REASON_REQUIRED',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const STUDIES_ERROR_KINDS = {
  [StudiesError.NotFound]: ErrorKind.NotFound,
  [StudiesError.CodeTaken]: ErrorKind.Conflict,
  [StudiesError.ReasonRequired]: ErrorKind.BadInput,
} as const satisfies Record<StudiesError, ErrorKind>;

/** A GyreException of this module: the kind comes from STUDIES_ERROR_KINDS. */
export const studiesError = errorFactory(STUDIES_ERROR_KINDS);
