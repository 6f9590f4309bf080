import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of worker tokens. */
export enum WorkerTokensError {
  NotFound = 'WORKER_TOKEN_NOT_FOUND',
  /** Another live token has this name (names are compared without case). */
  NameTaken = 'WORKER_TOKEN_NAME_TAKEN',
  /** "local worker" is the server's own token, made at every start. */
  NameReserved = 'WORKER_TOKEN_NAME_RESERVED',
  AlreadyRevoked = 'WORKER_TOKEN_ALREADY_REVOKED',
  /** The presented worker token is malformed, unknown or revoked. */
  Invalid = 'WORKER_TOKEN_INVALID',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const WORKER_TOKENS_ERROR_KINDS = {
  [WorkerTokensError.NotFound]: ErrorKind.NotFound,
  [WorkerTokensError.NameTaken]: ErrorKind.Conflict,
  [WorkerTokensError.NameReserved]: ErrorKind.Conflict,
  [WorkerTokensError.AlreadyRevoked]: ErrorKind.Conflict,
  [WorkerTokensError.Invalid]: ErrorKind.Unauthenticated,
} as const satisfies Record<WorkerTokensError, ErrorKind>;

/** A GyreException of this module: the kind comes from WORKER_TOKENS_ERROR_KINDS. */
export const workerTokensError = errorFactory(WORKER_TOKENS_ERROR_KINDS);
