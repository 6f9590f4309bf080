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
