import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

export enum SitesError {
  NotFound = 'SITE_NOT_FOUND',
  CodeTaken = 'SITE_CODE_TAKEN',
  InUse = 'SITE_IN_USE',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const SITES_ERROR_KINDS = {
  [SitesError.NotFound]: ErrorKind.NotFound,
  [SitesError.CodeTaken]: ErrorKind.Conflict,
  [SitesError.InUse]: ErrorKind.Conflict,
} as const satisfies Record<SitesError, ErrorKind>;

/** A GyreException of this module: the kind comes from SITES_ERROR_KINDS. */
export const sitesError = errorFactory(SITES_ERROR_KINDS);
