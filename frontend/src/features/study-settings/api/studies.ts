import type { Page, StudyView } from '@gyre/shared';
import { useCallback } from 'react';
import useSWR, { useSWRConfig } from 'swr';
import { apiFetch, apiSend, withQuery } from '../../../lib/api-client';

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

export interface TrendSettings {
  trendMinVisits: number;
  trendMinSpanDays: number;
}

/** `PATCH /api/studies/:id` with the trend settings (admin). */
export function useUpdateTrendSettings() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (id: string, settings: TrendSettings) => {
      const saved = await apiSend<StudyView>(studyKey(id), 'PATCH', settings);
      await mutate(studyKey(id), saved, { revalidate: false });
      await mutate(studiesKey);
      return saved;
    },
    [mutate],
  );
}
