import type { Page, UserView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/users`: the people whose actions the Ledger can be filtered by. */
export const auditPeopleKey = withQuery('/api/users', { pageSize: 200, sort: 'name' });

export function getAuditPeople(): Promise<Page<UserView>> {
  return apiFetch<Page<UserView>>(auditPeopleKey);
}

export function useAuditPeople() {
  return useSWR<Page<UserView>>(auditPeopleKey, getAuditPeople);
}
