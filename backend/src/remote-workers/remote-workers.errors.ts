/** Error codes of the worker API. */
export enum RemoteWorkersError {
  /** The server computes in-process (REDIS_URL is not set): it has no remote jobs. */
  NotRemote = 'WORKER_API_NOT_REMOTE',
  JobNotFound = 'WORKER_JOB_NOT_FOUND',
  /** The attempt is no longer the job's current one (finished, failed, or handed over again). */
  AttemptNotCurrent = 'WORKER_ATTEMPT_NOT_CURRENT',
  ResultInvalid = 'WORKER_RESULT_INVALID',
  ResultTooLarge = 'WORKER_RESULT_TOO_LARGE',
  /** The worker runs another Gyre version than the server: its numbers could differ. */
  VersionMismatch = 'WORKER_VERSION_MISMATCH',
}
