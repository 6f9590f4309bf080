export enum SitesError {
  NotFound = 'SITE_NOT_FOUND',
  CodeTaken = 'SITE_CODE_TAKEN',
  InUse = 'SITE_IN_USE',
}
