import type { StudyView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { studiesKey, studyKey } from '../../../lib/studies';

export interface TrendSettings {
  trendMinVisits: number;
  trendMinSpanDays: number;
}

/** The blinded-review switch with the reason the audit trail keeps. */
export interface BlindedReviewChange {
  blindedReview: boolean;
  reason: string;
}

/** `PATCH /api/studies/:id` with the trend settings (admin). */
export function useUpdateTrendSettings() {
  return useStudyPatch<TrendSettings>();
}

/** `PATCH /api/studies/:id` turning blinded review on or off, with a reason (admin). */
export function useUpdateBlindedReview() {
  return useStudyPatch<BlindedReviewChange>();
}

function useStudyPatch<Change extends object>() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (id: string, settings: Change) => {
      const saved = await apiSend<StudyView>(studyKey(id), 'PATCH', settings);
      await mutate(studyKey(id), saved, { revalidate: false });
      await mutate(studiesKey);
      return saved;
    },
    [mutate],
  );
}
