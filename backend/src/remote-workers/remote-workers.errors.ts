import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

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

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const REMOTE_WORKERS_ERROR_KINDS = {
  [RemoteWorkersError.NotRemote]: ErrorKind.NotFound,
  [RemoteWorkersError.JobNotFound]: ErrorKind.NotFound,
  [RemoteWorkersError.AttemptNotCurrent]: ErrorKind.Conflict,
  [RemoteWorkersError.ResultInvalid]: ErrorKind.BadInput,
  [RemoteWorkersError.ResultTooLarge]: ErrorKind.PayloadTooLarge,
  [RemoteWorkersError.VersionMismatch]: ErrorKind.Unprocessable,
} as const satisfies Record<RemoteWorkersError, ErrorKind>;

/** A GyreException of this module: the kind comes from REMOTE_WORKERS_ERROR_KINDS. */
export const remoteWorkersError = errorFactory(REMOTE_WORKERS_ERROR_KINDS);
