import type { UserView } from '@gyre/shared';
import { User } from '../accounts/user.entity';
import { toAuthUser } from '../auth/auth-user';

/** The only way a user leaves the server: no hash, no lockout counters. */
export function toUserView(user: User): UserView {
  return {
    ...toAuthUser(user),
    state: user.state,
    lastSignInAt: user.lastSignInAt,
    createdAt: user.createdAt,
    updatedAt: user.updatedAt,
  };
}
