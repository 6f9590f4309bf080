import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of the worklist. */
export enum WorklistError {
  /** A `section` the caller's role has no part of. */
  SectionNotYours = 'WORKLIST_SECTION_NOT_YOURS',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const WORKLIST_ERROR_KINDS = {
  [WorklistError.SectionNotYours]: ErrorKind.BadInput,
} as const satisfies Record<WorklistError, ErrorKind>;

/** A GyreException of this module: the kind comes from WORKLIST_ERROR_KINDS. */
export const worklistError = errorFactory(WORKLIST_ERROR_KINDS);
