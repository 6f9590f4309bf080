import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of the study overview. */
export enum StudyOverviewError {
  StudyNotFound = 'STUDY_OVERVIEW_STUDY_NOT_FOUND',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const STUDY_OVERVIEW_ERROR_KINDS = {
  [StudyOverviewError.StudyNotFound]: ErrorKind.NotFound,
} as const satisfies Record<StudyOverviewError, ErrorKind>;

/** A GyreException of this module: the kind comes from STUDY_OVERVIEW_ERROR_KINDS. */
export const studyOverviewError = errorFactory(STUDY_OVERVIEW_ERROR_KINDS);
