import type { WorklistView, WorklistQuery } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/worklist`: what waits for the caller, by section, each with its true count. */
export function worklistKey(query: WorklistQuery): string {
  const search = new URLSearchParams();
  for (const [name, value] of Object.entries(query)) {
    if (value !== undefined) search.set(name, String(value));
  }
  const text = search.toString();
  return text === '' ? '/api/worklist' : `/api/worklist?${text}`;
}

export function getWorklist(query: WorklistQuery): Promise<WorklistView> {
  return apiFetch<WorklistView>(worklistKey(query));
}

/** Asks only when `enabled`; refreshes every half minute while the home screen is open. */
export function useWorklist(query: WorklistQuery, enabled = true) {
  return useSWR<WorklistView>(enabled ? worklistKey(query) : null, () => getWorklist(query), {
    refreshInterval: 30_000,
    keepPreviousData: true,
  });
}
