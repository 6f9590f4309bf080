import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of slowing flags. */
export enum FlagsError {
  VisitNotFound = 'FLAG_VISIT_NOT_FOUND',
  AlreadyRaised = 'FLAG_ALREADY_RAISED',
  NotRaised = 'FLAG_NOT_RAISED',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const FLAGS_ERROR_KINDS = {
  [FlagsError.VisitNotFound]: ErrorKind.NotFound,
  [FlagsError.AlreadyRaised]: ErrorKind.Conflict,
  [FlagsError.NotRaised]: ErrorKind.Conflict,
} as const satisfies Record<FlagsError, ErrorKind>;

/** A GyreException of this module: the kind comes from FLAGS_ERROR_KINDS. */
export const flagsError = errorFactory(FLAGS_ERROR_KINDS);
