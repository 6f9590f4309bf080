/** Every client route, in one place. */
export const paths = {
  home: '/',
  signIn: '/sign-in',
  resetPassword: '/reset-password',
  acceptInvite: '/accept-invite',
  intake: '/intake',
  review: (visitId = ':visitId') => `/review/${visitId}`,
  participants: '/participants',
  participant: (participantId = ':participantId') => `/participants/${participantId}`,
  ledger: '/ledger',
  reports: '/reports',
  team: '/team',
} as const;
