/** The five roles of a Gyre installation (see docs/user-guide.md, "Who does what"). */
export const ROLES = ['technician', 'analyst', 'monitor', 'coordinator', 'admin'] as const;
export type Role = (typeof ROLES)[number];

/** Roles whose members belong to exactly one site of their study. */
export const SITE_ROLES: readonly Role[] = ['technician', 'coordinator'];

/** Roles whose members belong to one study; an admin manages the whole installation. */
export const STUDY_ROLES: readonly Role[] = ['technician', 'analyst', 'monitor', 'coordinator'];

/** Whether a member of `role` must be bound to a site (`true`), a study only, or neither. */
export function membershipOf(role: Role): 'site' | 'study' | 'installation' {
  if (SITE_ROLES.includes(role)) return 'site';
  if (STUDY_ROLES.includes(role)) return 'study';
  return 'installation';
}
