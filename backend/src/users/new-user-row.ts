import { randomUUID } from 'node:crypto';
import type { User } from '../accounts/user.entity';

/** Who a new account is: the fields its creator chooses. */
export type NewUserFields = Pick<User, 'email' | 'name' | 'role' | 'studyId' | 'siteId'>;

/**
 * A new account that has never signed in: active when it comes with a password hash (chosen
 * at `at`), else invited (the invitation link sets the password later).
 */
export function newUserRow(fields: NewUserFields, passwordHash: string | null, at: string): User {
  return {
    id: randomUUID(),
    ...fields,
    passwordHash,
    state: passwordHash === null ? 'invited' : 'active',
    failedSignIns: 0,
    lockedUntil: null,
    lastSignInAt: null,
    passwordChangedAt: passwordHash === null ? null : at,
    createdAt: at,
    updatedAt: at,
  };
}
