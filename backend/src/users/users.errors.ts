export enum UsersError {
  NotFound = 'USER_NOT_FOUND',
  EmailTaken = 'USER_EMAIL_TAKEN',
  MembershipInvalid = 'USER_MEMBERSHIP_INVALID',
  NotInvited = 'USER_NOT_INVITED',
  SelfLockout = 'USER_SELF_LOCKOUT',
}
