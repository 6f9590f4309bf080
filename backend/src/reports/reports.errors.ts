import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of visit reports. */
export enum ReportsError {
  NotFound = 'REPORT_NOT_FOUND',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const REPORTS_ERROR_KINDS = {
  [ReportsError.NotFound]: ErrorKind.NotFound,
} as const satisfies Record<ReportsError, ErrorKind>;

/** A GyreException of this module: the kind comes from REPORTS_ERROR_KINDS. */
export const reportsError = errorFactory(REPORTS_ERROR_KINDS);
