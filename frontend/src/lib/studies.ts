import type { Page, StudyView } from '@gyre/shared';
import { withQuery } from './api-client';
import { useRead } from './use-read';

/** `GET /api/studies`: the studies an admin sets up, by code. */
export const studiesKey = withQuery('/api/studies', { pageSize: 100, sort: 'code' });

export function useStudies(enabled: boolean) {
  return useRead<Page<StudyView>>(enabled ? studiesKey : null);
}

/** `GET /api/studies/:id`. */
export const studyKey = (id: string) => `/api/studies/${encodeURIComponent(id)}`;

export function useStudy(id: string | null) {
  return useRead<StudyView>(id === null ? null : studyKey(id));
}
