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
