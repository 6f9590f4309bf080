/** Error codes of visit reports. */
export enum ReportsError {
  NotFound = 'REPORT_NOT_FOUND',
  VisitNotFound = 'REPORT_VISIT_NOT_FOUND',
}
