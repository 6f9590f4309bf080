import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

export enum AuditError {
  BadTimeRange = 'AUDIT_BAD_TIME_RANGE',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const AUDIT_ERROR_KINDS = {
  [AuditError.BadTimeRange]: ErrorKind.BadInput,
} as const satisfies Record<AuditError, ErrorKind>;

/** A GyreException of this module: the kind comes from AUDIT_ERROR_KINDS. */
export const auditError = errorFactory(AUDIT_ERROR_KINDS);
