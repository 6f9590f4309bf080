import { ErrorKind, errorFactory } from '../common/errors/gyre.exception';

export enum UsersError {
  NotFound = 'USER_NOT_FOUND',
  EmailTaken = 'USER_EMAIL_TAKEN',
  MembershipInvalid = 'USER_MEMBERSHIP_INVALID',
  NotInvited = 'USER_NOT_INVITED',
  SelfLockout = 'USER_SELF_LOCKOUT',
}

/** The one place each code gets its kind (and so its HTTP status, http-exception.filter.ts). */
export const USERS_ERROR_KINDS = {
  [UsersError.NotFound]: ErrorKind.NotFound,
  [UsersError.EmailTaken]: ErrorKind.Conflict,
  [UsersError.MembershipInvalid]: ErrorKind.BadInput,
  [UsersError.NotInvited]: ErrorKind.Conflict,
  [UsersError.SelfLockout]: ErrorKind.Conflict,
} as const satisfies Record<UsersError, ErrorKind>;

/** A GyreException of this module: the kind comes from USERS_ERROR_KINDS. */
export const usersError = errorFactory(USERS_ERROR_KINDS);
