import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

export enum ScheduleError {
  PlannedVisitNotFound = 'PLANNED_VISIT_NOT_FOUND',
  PlannedVisitNameTaken = 'PLANNED_VISIT_NAME_TAKEN',
  PlannedVisitInUse = 'PLANNED_VISIT_IN_USE',
  GroupNotFound = 'STUDY_GROUP_NOT_FOUND',
  GroupNameTaken = 'STUDY_GROUP_NAME_TAKEN',
  GroupInUse = 'STUDY_GROUP_IN_USE',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const SCHEDULE_ERROR_KINDS = {
  [ScheduleError.PlannedVisitNotFound]: ErrorKind.NotFound,
  [ScheduleError.PlannedVisitNameTaken]: ErrorKind.Conflict,
  [ScheduleError.PlannedVisitInUse]: ErrorKind.Conflict,
  [ScheduleError.GroupNotFound]: ErrorKind.NotFound,
  [ScheduleError.GroupNameTaken]: ErrorKind.Conflict,
  [ScheduleError.GroupInUse]: ErrorKind.Conflict,
} as const satisfies Record<ScheduleError, ErrorKind>;

/** A GyreException of this module: the kind comes from SCHEDULE_ERROR_KINDS. */
export const scheduleError = errorFactory(SCHEDULE_ERROR_KINDS);
