import type { Page, StudyView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from '../../../lib/api-client';

/** `GET /api/studies`: every study of the installation (admin). */
export const studiesKey = withQuery('/api/studies', { pageSize: 200, sort: 'code' });

export function getStudies(): Promise<Page<StudyView>> {
  return apiFetch<Page<StudyView>>(studiesKey);
}

export function useStudies() {
  return useSWR<Page<StudyView>>(studiesKey, getStudies);
}
