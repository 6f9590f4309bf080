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
