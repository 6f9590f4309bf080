/** Every client route, in one place. */
export const paths = {
  home: '/',
  signIn: '/sign-in',
  forgotPassword: '/forgot-password',
  resetPassword: '/reset-password',
  acceptInvite: '/accept-invite',
  intake: '/intake',
  review: (visitId = ':visitId') => `/review/${visitId}`,
  participants: '/participants',
  participant: (participantId = ':participantId') => `/participants/${participantId}`,
  ledger: '/ledger',
  reports: '/reports',
  /** Signed revisions; `?revision=<id>` opens one (the coordinators' e-mail links here). */
  reportRevisions: '/reports/revisions',
  /** The study's analysis settings, version by version. */
  studySettings: '/study-settings',
  /** An admin's set-up of each study: visit schedule, groups, trend settings. */
  studySetup: '/study-setup',
  /** Group courses over the planned visits, completion and site quality (`?study=` for admins). */
  studyOverview: '/study-overview',
  /** Each site's calibration run: Gyre's check of its own computation. */
  siteCheck: '/site-check',
  team: '/team',
  outbox: '/outbox',
} as const;

/** The sign-in address that brings the user back to `returnTo` afterwards. */
export type SignInReason = 'expired' | 'signed-out' | 'password-reset' | 'invitation-accepted';

export function signInPath(returnTo?: string, reason?: SignInReason): string {
  const search = new URLSearchParams();
  if (returnTo !== undefined && isSafeReturnPath(returnTo) && returnTo !== paths.home) {
    search.set('next', returnTo);
  }
  if (reason !== undefined) search.set('reason', reason);
  const query = search.toString();
  return query.length > 0 ? `${paths.signIn}?${query}` : paths.signIn;
}

/** Only paths inside Gyre: never another site (`//host`, `https:`), never the sign-in page. */
export function isSafeReturnPath(value: string | null): value is string {
  return (
    value !== null &&
    value.startsWith('/') &&
    !value.startsWith('//') &&
    !value.startsWith('/\\') &&
    !value.startsWith(paths.signIn)
  );
}
