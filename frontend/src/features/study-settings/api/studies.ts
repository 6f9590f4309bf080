import type { StudyView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { studiesKey, studyKey } from '../../../lib/studies';

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
