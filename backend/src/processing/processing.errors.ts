/** Error codes of re-runs. */
export enum ProcessingError {
  VisitNotFound = 'PROCESSING_VISIT_NOT_FOUND',
  NothingToCompute = 'PROCESSING_NOTHING_TO_COMPUTE',
}
