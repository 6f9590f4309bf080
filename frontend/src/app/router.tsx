import type { Action, SubjectName } from '@gyre/shared';
import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { NotFoundPage } from '../components/not-found-page';
import { RequireAbility } from '../components/require-ability';
import { ForgotPasswordPage } from '../features/auth/components/forgot-password-page';
import { SignInRoute } from '../features/auth/components/sign-in-route';
import { TokenPasswordPage } from '../features/auth/components/token-password-page';
import { HomePage } from '../features/home/home-page';
import { IntakePage } from '../features/intake/components/intake-page';
import { LedgerPage } from '../features/ledger/components/ledger-page';
import { ReportsPage } from '../features/reports/components/reports-page';
import { ParticipantPage } from '../features/participants/components/participant-page';
import { ParticipantsPage } from '../features/participants/components/participants-page';
import { ReviewPage } from '../features/review/components/review-page';
import { ReportSignOff } from '../features/signoff/components/report-sign-off';
import { SignedReportsPage } from '../features/signoff/components/signed-reports-page';
import { StudySettingsPage } from '../features/study-settings/components/study-settings-page';
import { OutboxPage } from '../features/team/components/outbox-page';
import { TeamPage } from '../features/team/components/team-page';
import { paths } from './paths';
import { SessionGate } from './session-gate';

/**
 * A signed-in screen: its path, what the rules must allow for it to open (otherwise the
 * "not available for your role" page shows), and its element.
 */
export interface ScreenRoute {
  path: string;
  screen: string;
  requires: readonly [Action, SubjectName];
  element: React.ReactNode;
}

/** Screens of this part of the client. */
const SCREENS: ScreenRoute[] = [
  {
    path: paths.intake,
    screen: 'Intake',
    requires: ['upload', 'Recording'],
    element: <IntakePage />,
  },
  {
    path: paths.ledger,
    screen: 'The Ledger',
    requires: ['read', 'AuditEntry'],
    element: <LedgerPage />,
  },
  {
    path: paths.reports,
    screen: 'Reports',
    requires: ['read', 'Report'],
    element: <ReportsPage />,
  },
  {
    path: paths.reportRevisions,
    screen: 'Signed report revisions',
    requires: ['read', 'Report'],
    element: <SignedReportsPage />,
  },
  {
    path: paths.studySettings,
    screen: 'Study settings',
    requires: ['read', 'AnalysisSettings'],
    element: <StudySettingsPage />,
  },
  { path: paths.team, screen: 'Team', requires: ['update', 'User'], element: <TeamPage /> },
  {
    path: paths.outbox,
    screen: 'The outbox',
    requires: ['read', 'Outbox'],
    element: <OutboxPage />,
  },
];

/**
 * Screens of `features/review` and `features/participants`: add them here (and their menu
 * entries in `navigation.ts`). Review needs ['read', 'Result'].
 */
const REVIEW_AND_PARTICIPANT_SCREENS: ScreenRoute[] = [
  {
    path: paths.review(),
    screen: 'Review',
    requires: ['read', 'Result'],
    element: (
      <ReviewPage
        reportPanel={(visitId, watch) => <ReportSignOff visitId={visitId} watch={watch} />}
      />
    ),
  },
  {
    path: paths.participants,
    screen: 'Participants',
    requires: ['read', 'Result'],
    element: <ParticipantsPage />,
  },
  {
    path: paths.participant(),
    screen: 'The participant trajectory',
    requires: ['read', 'Result'],
    element: <ParticipantPage />,
  },
];

function guarded({ path, screen, requires, element }: ScreenRoute): RouteObject {
  return {
    path,
    element: (
      <RequireAbility action={requires[0]} subject={requires[1]} screen={screen}>
        {element}
      </RequireAbility>
    ),
  };
}

export const routes: RouteObject[] = [
  { path: paths.signIn, element: <SignInRoute /> },
  { path: paths.forgotPassword, element: <ForgotPasswordPage /> },
  { path: paths.resetPassword, element: <TokenPasswordPage purpose="reset" /> },
  { path: paths.acceptInvite, element: <TokenPasswordPage purpose="invitation" /> },
  {
    path: paths.home,
    element: <SessionGate />,
    children: [
      { index: true, element: <HomePage /> },
      ...[...SCREENS, ...REVIEW_AND_PARTICIPANT_SCREENS].map(guarded),
      { path: '*', element: <NotFoundPage /> },
    ],
  },
];

export function createRouter() {
  return createBrowserRouter(routes);
}
