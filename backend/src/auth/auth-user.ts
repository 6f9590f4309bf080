import type { Request } from 'express';
import type { AppAbility, Role } from '@gyre/shared';

/** The signed-in user as every handler sees it (loaded fresh from the database per request). */
export interface AuthUser {
  id: string;
  email: string;
  name: string;
  role: Role;
  /** `null` for admins only. */
  studyId: string | null;
  /** Set for technicians and coordinators only. */
  siteId: string | null;
}

/** What the guards attach to an Express request. */
export interface GyreRequest extends Request {
  user?: AuthUser;
  ability?: AppAbility;
}
