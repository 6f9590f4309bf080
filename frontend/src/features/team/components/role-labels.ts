import type { Role } from '@gyre/shared';

export const ROLE_LABELS: Record<Role, string> = {
  technician: 'Technician',
  analyst: 'Analyst',
  monitor: 'Monitor',
  coordinator: 'Coordinator',
  admin: 'Administrator',
};

/** What each role does, in one line (the role table of docs/user-guide.md ("Who does what")). */
export const ROLE_DUTIES: Record<Role, string> = {
  technician: 'Registers visits and uploads recordings at one site.',
  analyst: 'Reviews results of every site, raises or clears slowing flags, signs reports.',
  monitor: 'Reads everything in the study and works from the Ledger; changes nothing.',
  coordinator: "Receives and downloads signed reports of one site's participants.",
  admin: 'Manages studies, sites, users and roles; never signs or flags.',
};
