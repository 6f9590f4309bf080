import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

export enum VisitsError {
  NotFound = 'VISIT_NOT_FOUND',
  LabelTaken = 'VISIT_LABEL_TAKEN',
  BadDate = 'VISIT_BAD_DATE',
  LabelRequired = 'VISIT_LABEL_REQUIRED',
  PlannedVisitRequired = 'VISIT_PLANNED_VISIT_REQUIRED',
  PlannedVisitNotInStudy = 'VISIT_PLANNED_VISIT_NOT_IN_STUDY',
  PlannedVisitTaken = 'VISIT_PLANNED_VISIT_TAKEN',
  LabelIsPlannedName = 'VISIT_LABEL_IS_PLANNED_NAME',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const VISITS_ERROR_KINDS = {
  [VisitsError.NotFound]: ErrorKind.NotFound,
  [VisitsError.LabelTaken]: ErrorKind.Conflict,
  [VisitsError.BadDate]: ErrorKind.BadInput,
  [VisitsError.LabelRequired]: ErrorKind.BadInput,
  [VisitsError.PlannedVisitRequired]: ErrorKind.BadInput,
  [VisitsError.PlannedVisitNotInStudy]: ErrorKind.BadInput,
  [VisitsError.PlannedVisitTaken]: ErrorKind.Conflict,
  [VisitsError.LabelIsPlannedName]: ErrorKind.BadInput,
} as const satisfies Record<VisitsError, ErrorKind>;

/** A GyreException of this module: the kind comes from VISITS_ERROR_KINDS. */
export const visitsError = errorFactory(VISITS_ERROR_KINDS);
