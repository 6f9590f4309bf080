export enum ScheduleError {
  PlannedVisitNotFound = 'PLANNED_VISIT_NOT_FOUND',
  PlannedVisitNameTaken = 'PLANNED_VISIT_NAME_TAKEN',
  PlannedVisitInUse = 'PLANNED_VISIT_IN_USE',
  GroupNotFound = 'STUDY_GROUP_NOT_FOUND',
  GroupNameTaken = 'STUDY_GROUP_NAME_TAKEN',
  GroupInUse = 'STUDY_GROUP_IN_USE',
}
