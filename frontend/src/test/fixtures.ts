import { packRulesFor, type MeResponse, type Role } from '@gyre/shared';

// Generated test data: an invented study with two sites and one user per role.
export const STUDY = {
  id: 'study-1',
  code: 'ALPHA-AGE',
  name: 'Alpha in ageing',
  description: '',
  trendMinVisits: 3,
  trendMinSpanDays: 90,
  createdAt: '2025-01-06T09:00:00.000Z',
  updatedAt: '2025-01-06T09:00:00.000Z',
};
export const SITE = {
  id: 'site-a',
  studyId: STUDY.id,
  code: 'NORTH',
  name: 'North clinic',
  createdAt: '2025-01-06T09:00:00.000Z',
  updatedAt: '2025-01-06T09:00:00.000Z',
};

const NAMES: Record<Role, string> = {
  technician: 'Tomas Tech',
  analyst: 'Ana Lyst',
  monitor: 'Mona Itor',
  coordinator: 'Cora Dinator',
  admin: 'Adam Min',
};

/** What `GET /api/auth/me` answers for a user of `role`, with the real rules of shared/. */
export function meFor(role: Role): MeResponse {
  const studyId = role === 'admin' ? null : STUDY.id;
  const siteId = role === 'technician' || role === 'coordinator' ? SITE.id : null;
  const user = {
    id: `user-${role}`,
    email: `${role}@example.org`,
    name: NAMES[role],
    role,
    studyId,
    siteId,
    state: 'active' as const,
    lastSignInAt: null,
    createdAt: '2025-01-06T09:00:00.000Z',
    updatedAt: '2025-01-06T09:00:00.000Z',
  };
  return {
    user,
    study: studyId === null ? null : STUDY,
    site: siteId === null ? null : SITE,
    rules: packRulesFor({ id: user.id, role, studyId, siteId }),
  };
}
