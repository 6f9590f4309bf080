import type { Role, UserState, UserView } from '@gyre/shared';
import { withQuery } from '../../../lib/api-client';
import { usePage } from '../../../lib/use-page';

export interface UserFilters {
  role?: Role;
  state?: UserState;
  /** Part of the name or e-mail. */
  q?: string;
}

export const USERS_PATH = '/api/users';

/** `GET /api/users`: accounts, filtered and paged by the server. */
export function usersKey(filters: UserFilters, page: number, pageSize: number): string {
  return withQuery(USERS_PATH, { ...filters, page, pageSize, sort: 'name' });
}

export function useUsers(filters: UserFilters, page: number, pageSize: number) {
  return usePage<UserView>(usersKey(filters, page, pageSize));
}

/** Matches every users list key, whatever its filters, so a change refreshes them all. */
export const isUsersKey = (key: unknown): boolean =>
  typeof key === 'string' && (key === USERS_PATH || key.startsWith(`${USERS_PATH}?`));
