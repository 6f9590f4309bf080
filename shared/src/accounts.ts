import type { PackedRules } from './permissions';
import type { Role } from './roles';
import type { SiteView, StudyView } from './study-model';

export const USER_STATES = ['invited', 'active', 'deactivated'] as const;
export type UserState = (typeof USER_STATES)[number];

/** Shortest password Gyre accepts (characters). */
export const PASSWORD_MIN_LENGTH = 12;
/** bcrypt reads only the first 72 bytes of a password, so longer ones are refused. */
export const PASSWORD_MAX_BYTES = 72;

/** A user as the API shows them: never a password hash or lockout counter. */
export interface UserView {
  id: string;
  email: string;
  name: string;
  role: Role;
  /** `null` for admins only. */
  studyId: string | null;
  /** Set for technicians and coordinators only. */
  siteId: string | null;
  state: UserState;
  lastSignInAt: string | null;
  createdAt: string;
  updatedAt: string;
}

/** `POST /api/auth/sign-in` and `POST /api/auth/refresh`; the refresh token is a cookie. */
export interface SessionResponse {
  accessToken: string;
  tokenType: 'Bearer';
  /** Lifetime of the access token in seconds. */
  expiresInS: number;
  user: UserView;
}

/** `GET /api/auth/me`: who is signed in, where, and the CASL rules packed for the client. */
export interface MeResponse {
  user: UserView;
  study: StudyView | null;
  site: SiteView | null;
  rules: PackedRules;
}
