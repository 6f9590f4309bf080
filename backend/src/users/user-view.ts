import type { UserView } from '@gyre/shared';
import { User } from '../accounts/user.entity';

/** The only way a user leaves the server: no hash, no lockout counters. */
export function toUserView(user: User): UserView {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    studyId: user.studyId,
    siteId: user.siteId,
    state: user.state,
    lastSignInAt: user.lastSignInAt,
    createdAt: user.createdAt,
    updatedAt: user.updatedAt,
  };
}
