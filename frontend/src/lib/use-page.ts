import type { Page } from '@gyre/shared';
import useSWR, { type SWRConfiguration } from 'swr';
import { apiFetch } from './api-client';

/**
 * One page of a server-paged list at `key` (null: no request). The last page stays on screen
 * while the next one loads, so the table does not jump.
 */
export function usePage<Row>(key: string | null, options: SWRConfiguration<Page<Row>> = {}) {
  return useSWR<Page<Row>>(key, (at: string) => apiFetch<Page<Row>>(at), {
    keepPreviousData: true,
    ...options,
  });
}
