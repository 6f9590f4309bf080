import useSWR, { type SWRConfiguration } from 'swr';
import { apiFetch } from './api-client';

/** The JSON the API answers at `key` (null: no request), read and cached by SWR under it. */
export function useRead<Value>(key: string | null, options: SWRConfiguration<Value> = {}) {
  return useSWR<Value>(key, (at: string) => apiFetch<Value>(at), options);
}
