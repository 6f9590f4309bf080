import type { Action, Role, SubjectName } from '@gyre/shared';
import { paths } from './paths';

/**
 * The main navigation. An entry shows when the user's role is listed AND their rules allow
 * `can` (the rules decide; `roles` keeps each role's menu to the screens it works from).
 * The screens of `features/review` and `features/participants` add their entries here.
 */
export interface NavEntry {
  path: string;
  label: string;
  roles: readonly Role[];
  can: readonly [Action, SubjectName];
}

export const NAV_ENTRIES: readonly NavEntry[] = [
  { path: paths.intake, label: 'Intake', roles: ['technician'], can: ['upload', 'Recording'] },
  {
    path: paths.participants,
    label: 'Participants',
    roles: ['analyst', 'monitor'],
    can: ['read', 'Result'],
  },
  {
    path: paths.studyOverview,
    label: 'Study overview',
    roles: ['analyst', 'monitor', 'admin'],
    can: ['read', 'StudyOverview'],
  },
  {
    path: paths.studySettings,
    label: 'Study settings',
    roles: ['analyst', 'monitor'],
    can: ['read', 'AnalysisSettings'],
  },
  { path: paths.ledger, label: 'Ledger', roles: ['monitor', 'admin'], can: ['read', 'AuditEntry'] },
  {
    path: paths.siteCheck,
    label: 'Site check',
    roles: ['technician', 'analyst', 'monitor', 'admin'],
    can: ['read', 'Calibration'],
  },
  { path: paths.reports, label: 'Reports', roles: ['coordinator'], can: ['read', 'Report'] },
  { path: paths.team, label: 'Team', roles: ['admin'], can: ['update', 'User'] },
  {
    path: paths.studySetup,
    label: 'Study set-up',
    roles: ['admin'],
    can: ['update', 'PlannedVisit'],
  },
  { path: paths.outbox, label: 'Outbox', roles: ['admin'], can: ['read', 'Outbox'] },
];

interface Checker {
  can: (action: Action, subject: SubjectName) => boolean;
}

export function navEntriesFor(role: Role, ability: Checker): NavEntry[] {
  return NAV_ENTRIES.filter(
    (entry) => entry.roles.includes(role) && ability.can(entry.can[0], entry.can[1]),
  );
}
