import type { Request } from 'express';
import type { AppAbility, UserView } from '@gyre/shared';

/** The signed-in user as every handler sees it (loaded fresh from the database per request). */
export type AuthUser = Pick<UserView, 'id' | 'email' | 'name' | 'role' | 'studyId' | 'siteId'>;

/** The signed-in facts of a user row (a `User`, or the sign-in read of one), nothing more. */
export function toAuthUser(user: AuthUser): AuthUser {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    studyId: user.studyId,
    siteId: user.siteId,
  };
}

/**
 * A worker process authenticated with a worker token (docs/security.md, "Worker tokens"). It
 * is no user: it has no role, study or site, and only the rules of `defineWorkerRules`.
 */
export interface WorkerPrincipal {
  tokenId: string;
  /** The token's name, for logs and the audit trail. */
  name: string;
}

/** What the guards attach to an Express request: a user or a worker, never both. */
export interface GyreRequest extends Request {
  user?: AuthUser;
  worker?: WorkerPrincipal;
  ability?: AppAbility;
}
