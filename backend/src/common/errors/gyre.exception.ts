/** What kind of failure an error is; the exception filter maps each kind to one HTTP status. */
export enum ErrorKind {
  BadInput = 'bad_input',
  Unprocessable = 'unprocessable',
  Unauthenticated = 'unauthenticated',
  Forbidden = 'forbidden',
  NotFound = 'not_found',
  Conflict = 'conflict',
  PayloadTooLarge = 'payload_too_large',
  TooManyRequests = 'too_many_requests',
  /** The resource is temporarily locked (an account after too many wrong passwords). */
  Locked = 'locked',
  Unavailable = 'unavailable',
}

/**
 * The one exception class Gyre's modules throw. Each module names its codes in its own
 * `*.errors.ts` enum; `code` is what clients switch on, `message` is for people.
 */
export class GyreException extends Error {
  constructor(
    readonly kind: ErrorKind,
    readonly code: string,
    message: string,
    readonly details?: Record<string, unknown>,
  ) {
    super(message);
    this.name = 'GyreException';
  }
}

/**
 * A module's thrower: `errorFactory(X_ERROR_KINDS)` where X_ERROR_KINDS is the module's one
 * `{ … } satisfies Record<XError, ErrorKind>`, so a code's kind is written once.
 */
export function errorFactory<Code extends string>(
  kinds: Readonly<Record<Code, ErrorKind>>,
): (code: Code, message: string, details?: Record<string, unknown>) => GyreException {
  return (code, message, details) => new GyreException(kinds[code], code, message, details);
}
