import type { Page, StudyView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch, withQuery } from './api-client';

/** `GET /api/studies`: the studies an admin sets up, by code. */
export const studiesKey = withQuery('/api/studies', { pageSize: 100, sort: 'code' });

export function useStudies(enabled: boolean) {
  return useSWR<Page<StudyView>>(enabled ? studiesKey : null, () =>
    apiFetch<Page<StudyView>>(studiesKey),
  );
}

/** `GET /api/studies/:id`. */
export const studyKey = (id: string) => `/api/studies/${encodeURIComponent(id)}`;

export function useStudy(id: string | null) {
  return useSWR<StudyView>(id === null ? null : studyKey(id), () =>
    apiFetch<StudyView>(studyKey(id ?? '')),
  );
}
