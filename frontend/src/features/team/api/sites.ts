import type { Page, SiteView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/sites`: every site the admin manages, of every study. */
export const sitesKey = withQuery('/api/sites', { pageSize: 200, sort: 'code' });

export function getSites(): Promise<Page<SiteView>> {
  return apiFetch<Page<SiteView>>(sitesKey);
}

export function useSites() {
  return useSWR<Page<SiteView>>(sitesKey, getSites);
}
