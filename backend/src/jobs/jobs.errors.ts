/** Error codes of the job queue and re-runs. */
export enum JobsError {
  RecordingNotFound = 'JOB_RECORDING_NOT_FOUND',
  VisitNotFound = 'JOB_VISIT_NOT_FOUND',
  NotComputable = 'JOB_NOT_COMPUTABLE',
  AlreadyQueued = 'JOB_ALREADY_QUEUED',
}
