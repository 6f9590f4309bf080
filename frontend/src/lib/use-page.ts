import type { Page } from '@gyre/shared';
import type { SWRConfiguration } from 'swr';
import { useRead } from './use-read';

/**
 * One page of a server-paged list at `key` (null: no request). The last page stays on screen
 * while the next one loads, so the table does not jump.
 */
export function usePage<Row>(key: string | null, options: SWRConfiguration<Page<Row>> = {}) {
  return useRead<Page<Row>>(key, { keepPreviousData: true, ...options });
}
