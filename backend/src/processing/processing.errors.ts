import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of re-runs. */
export enum ProcessingError {
  VisitNotFound = 'PROCESSING_VISIT_NOT_FOUND',
  NothingToCompute = 'PROCESSING_NOTHING_TO_COMPUTE',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const PROCESSING_ERROR_KINDS = {
  [ProcessingError.VisitNotFound]: ErrorKind.NotFound,
  [ProcessingError.NothingToCompute]: ErrorKind.Conflict,
} as const satisfies Record<ProcessingError, ErrorKind>;

/** A GyreException of this module: the kind comes from PROCESSING_ERROR_KINDS. */
export const processingError = errorFactory(PROCESSING_ERROR_KINDS);
