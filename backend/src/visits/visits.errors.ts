export enum VisitsError {
  NotFound = 'VISIT_NOT_FOUND',
  LabelTaken = 'VISIT_LABEL_TAKEN',
  BadDate = 'VISIT_BAD_DATE',
}
