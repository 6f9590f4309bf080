import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

/** Error codes of sign-in, tokens and permissions. */
export enum AuthError {
  SignInRequired = 'AUTH_SIGN_IN_REQUIRED',
  TokenInvalid = 'AUTH_TOKEN_INVALID',
  /** A valid access token whose session was ended (sign-out, password or role change, lock). */
  SessionEnded = 'AUTH_SESSION_ENDED',
  WrongCredentials = 'AUTH_WRONG_CREDENTIALS',
  AccountLocked = 'AUTH_ACCOUNT_LOCKED',
  /** Too many failed sign-ins for this account or from this address: wait and retry. */
  SignInThrottled = 'AUTH_SIGN_IN_THROTTLED',
  /** More requests to /api/auth than an address may send in a minute. */
  TooManyRequests = 'AUTH_TOO_MANY_REQUESTS',
  RefreshMissing = 'AUTH_REFRESH_MISSING',
  RefreshInvalid = 'AUTH_REFRESH_INVALID',
  RefreshReused = 'AUTH_REFRESH_REUSED',
  OneTimeTokenInvalid = 'AUTH_ONE_TIME_TOKEN_INVALID',
  OneTimeTokenExpired = 'AUTH_ONE_TIME_TOKEN_EXPIRED',
  OneTimeTokenUsed = 'AUTH_ONE_TIME_TOKEN_USED',
  PasswordTooWeak = 'AUTH_PASSWORD_TOO_WEAK',
  CurrentPasswordWrong = 'AUTH_CURRENT_PASSWORD_WRONG',
  Forbidden = 'AUTH_FORBIDDEN',
  RouteWithoutPermission = 'AUTH_ROUTE_WITHOUT_PERMISSION',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const AUTH_ERROR_KINDS = {
  [AuthError.SignInRequired]: ErrorKind.Unauthenticated,
  [AuthError.TokenInvalid]: ErrorKind.Unauthenticated,
  [AuthError.SessionEnded]: ErrorKind.Unauthenticated,
  // 422 like a wrong current password and a wrong signing password (docs/security.md):
  // a 401 would tell the client its session had expired.
  [AuthError.WrongCredentials]: ErrorKind.Unprocessable,
  [AuthError.AccountLocked]: ErrorKind.Locked,
  [AuthError.SignInThrottled]: ErrorKind.TooManyRequests,
  [AuthError.TooManyRequests]: ErrorKind.TooManyRequests,
  [AuthError.RefreshMissing]: ErrorKind.Unauthenticated,
  [AuthError.RefreshInvalid]: ErrorKind.Unauthenticated,
  [AuthError.RefreshReused]: ErrorKind.Unauthenticated,
  [AuthError.OneTimeTokenInvalid]: ErrorKind.BadInput,
  [AuthError.OneTimeTokenExpired]: ErrorKind.BadInput,
  [AuthError.OneTimeTokenUsed]: ErrorKind.BadInput,
  [AuthError.PasswordTooWeak]: ErrorKind.BadInput,
  [AuthError.CurrentPasswordWrong]: ErrorKind.Unprocessable,
  [AuthError.Forbidden]: ErrorKind.Forbidden,
  [AuthError.RouteWithoutPermission]: ErrorKind.Forbidden,
} as const satisfies Record<AuthError, ErrorKind>;

/** A GyreException of this module: the kind comes from AUTH_ERROR_KINDS. */
export const authError = errorFactory(AUTH_ERROR_KINDS);
