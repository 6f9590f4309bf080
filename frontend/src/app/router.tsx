import type { Action, SubjectName } from '@gyre/shared';
import { createBrowserRouter, type RouteObject } from 'react-router-dom';
import { SignInRoute } from '../features/auth/components/sign-in-route';
import { paths } from './paths';
import { FirstScreenLoading, RouteError, RouteShell } from './route-states';

/**
 * Only the sign-in page is part of the first download. Everything behind it (the session
 * gate with its rules and the app frame, each screen, the chart library) is fetched when a
 * route needs it, through React Router's `lazy`: the router fetches every matched level at
 * once and keeps the current screen until the next one is ready. The chart library is
 * fetched only when a chart is about to be drawn (components/charts/plot-figure.tsx):
 * fetched beside a screen's own code, it slowed Review down on a 2-core machine (bench:client).
 */

/**
 * A signed-in screen: its path, what the rules must allow for it to open (otherwise the
 * "not available for your role" page shows), and how to load its element.
 */
export interface ScreenRoute {
  path: string;
  screen: string;
  requires: readonly [Action, SubjectName];
  load: () => Promise<React.ReactNode>;
}

/** Screens of this part of the client. */
const SCREENS: ScreenRoute[] = [
  {
    path: paths.intake,
    screen: 'Intake',
    requires: ['upload', 'Recording'],
    load: async () => {
      const { IntakePage } = await import('../features/intake/components/intake-page');
      return <IntakePage />;
    },
  },
  {
    path: paths.ledger,
    screen: 'The Ledger',
    requires: ['read', 'AuditEntry'],
    load: async () => {
      const { LedgerPage } = await import('../features/ledger/components/ledger-page');
      return <LedgerPage />;
    },
  },
  {
    path: paths.reports,
    screen: 'Reports',
    requires: ['read', 'Report'],
    load: async () => {
      const { ReportsPage } = await import('../features/reports/components/reports-page');
      return <ReportsPage />;
    },
  },
  {
    path: paths.reportRevisions,
    screen: 'Signed report revisions',
    requires: ['read', 'Report'],
    load: async () => {
      const { SignedReportsPage } =
        await import('../features/signoff/components/signed-reports-page');
      return <SignedReportsPage />;
    },
  },
  {
    path: paths.studySettings,
    screen: 'Study settings',
    requires: ['read', 'AnalysisSettings'],
    load: async () => {
      const { StudySettingsPage } =
        await import('../features/study-settings/components/study-settings-page');
      return <StudySettingsPage />;
    },
  },
  {
    path: paths.studySetup,
    screen: 'Study set-up',
    requires: ['update', 'PlannedVisit'],
    load: async () => {
      const { StudySetupPage } =
        await import('../features/study-settings/components/study-setup-page');
      return <StudySetupPage />;
    },
  },
  {
    path: paths.studyOverview,
    screen: 'Study overview',
    requires: ['read', 'StudyOverview'],
    load: async () => {
      const { StudyOverviewPage } =
        await import('../features/study-overview/components/study-overview-page');
      return <StudyOverviewPage />;
    },
  },
  {
    path: paths.siteCheck,
    screen: 'Site check',
    requires: ['read', 'Calibration'],
    load: async () => {
      const { SiteCheckPage } = await import('../features/calibration/components/site-check-page');
      return <SiteCheckPage />;
    },
  },
  {
    path: paths.team,
    screen: 'Team',
    requires: ['update', 'User'],
    load: async () => {
      const { TeamPage } = await import('../features/team/components/team-page');
      return <TeamPage />;
    },
  },
  {
    path: paths.outbox,
    screen: 'The outbox',
    requires: ['read', 'Outbox'],
    load: async () => {
      const { OutboxPage } = await import('../features/team/components/outbox-page');
      return <OutboxPage />;
    },
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
    load: async () => {
      const [{ ReviewPage }, { ReportSignOff, ReportStatusTag }] = await Promise.all([
        import('../features/review/components/review-page'),
        import('../features/signoff/components/report-sign-off'),
      ]);
      return (
        <ReviewPage
          reportPanel={(visitId, watch) => <ReportSignOff visitId={visitId} watch={watch} />}
          reportStatus={(visitId) => <ReportStatusTag visitId={visitId} />}
        />
      );
    },
  },
  {
    path: paths.participants,
    screen: 'Participants',
    requires: ['read', 'Result'],
    load: async () => {
      const { ParticipantsPage } =
        await import('../features/participants/components/participants-page');
      return <ParticipantsPage />;
    },
  },
  {
    path: paths.participant(),
    screen: 'The participant trajectory',
    requires: ['read', 'Result'],
    load: async () => {
      const { ParticipantPage } =
        await import('../features/participants/components/participant-page');
      return <ParticipantPage />;
    },
  },
];

function guarded({ path, screen, requires, load }: ScreenRoute): RouteObject {
  return {
    path,
    lazy: async () => {
      const [{ RequireAbility }, element] = await Promise.all([
        import('../components/require-ability'),
        load(),
      ]);
      return {
        element: (
          <RequireAbility action={requires[0]} subject={requires[1]} screen={screen}>
            {element}
          </RequireAbility>
        ),
      };
    },
  };
}

export const routes: RouteObject[] = [
  {
    element: <RouteShell />,
    hydrateFallbackElement: <FirstScreenLoading />,
    errorElement: <RouteError />,
    children: [
      { path: paths.signIn, element: <SignInRoute /> },
      {
        path: paths.forgotPassword,
        lazy: async () => {
          const { ForgotPasswordPage } =
            await import('../features/auth/components/forgot-password-page');
          return { element: <ForgotPasswordPage /> };
        },
      },
      {
        path: paths.resetPassword,
        lazy: async () => {
          const { TokenPasswordPage } =
            await import('../features/auth/components/token-password-page');
          return { element: <TokenPasswordPage purpose="reset" /> };
        },
      },
      {
        path: paths.acceptInvite,
        lazy: async () => {
          const { TokenPasswordPage } =
            await import('../features/auth/components/token-password-page');
          return { element: <TokenPasswordPage purpose="invitation" /> };
        },
      },
      {
        path: paths.home,
        lazy: async () => {
          const { SessionGate } = await import('./session-gate');
          return { element: <SessionGate /> };
        },
        children: [
          {
            index: true,
            lazy: async () => {
              const [{ HomePage }, { FailedCalibrationNotice }] = await Promise.all([
                import('../features/home/home-page'),
                import('../features/calibration/components/failed-calibration-notice'),
              ]);
              return { element: <HomePage notices={<FailedCalibrationNotice />} /> };
            },
          },
          ...[...SCREENS, ...REVIEW_AND_PARTICIPANT_SCREENS].map(guarded),
          {
            path: '*',
            lazy: async () => {
              const { NotFoundPage } = await import('../components/not-found-page');
              return { element: <NotFoundPage /> };
            },
          },
        ],
      },
    ],
  },
];

export function createRouter() {
  return createBrowserRouter(routes);
}
