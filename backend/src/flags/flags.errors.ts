/** Error codes of slowing flags. */
export enum FlagsError {
  VisitNotFound = 'FLAG_VISIT_NOT_FOUND',
  AlreadyRaised = 'FLAG_ALREADY_RAISED',
  NotRaised = 'FLAG_NOT_RAISED',
}
