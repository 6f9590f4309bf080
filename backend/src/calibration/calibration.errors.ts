import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

export enum CalibrationError {
  SiteNotFound = 'CALIBRATION_SITE_NOT_FOUND',
  AlreadyRunning = 'CALIBRATION_ALREADY_RUNNING',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const CALIBRATION_ERROR_KINDS = {
  [CalibrationError.SiteNotFound]: ErrorKind.NotFound,
  [CalibrationError.AlreadyRunning]: ErrorKind.Conflict,
} as const satisfies Record<CalibrationError, ErrorKind>;

/** A GyreException of this module: the kind comes from CALIBRATION_ERROR_KINDS. */
export const calibrationError = errorFactory(CALIBRATION_ERROR_KINDS);
