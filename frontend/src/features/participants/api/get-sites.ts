import type { Page, SiteView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/sites`: the sites in the user's scope, for the participants' site column and filter. */
export const sitesKey = withQuery('/api/sites', { pageSize: 200, sort: 'code', order: 'asc' });

export async function getSites(): Promise<SiteView[]> {
  const page = await apiFetch<Page<SiteView>>(sitesKey);
  return page.items;
}

export function useSites() {
  return useSWR<SiteView[]>(sitesKey, getSites);
}
