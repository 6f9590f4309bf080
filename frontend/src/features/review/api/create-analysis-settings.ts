import type { AnalysisSettingsChange, AnalysisSettingsDto } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { analysisSettingsKey } from './get-analysis-settings';

/** `POST /api/studies/:studyId/analysis-settings`: saves a new settings version. */
export function createAnalysisSettings(
  studyId: string,
  change: AnalysisSettingsChange,
): Promise<AnalysisSettingsDto> {
  return apiSend<AnalysisSettingsDto>(analysisSettingsKey(studyId), 'POST', change);
}

export function useCreateAnalysisSettings() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (studyId: string, change: AnalysisSettingsChange) => {
      const created = await createAnalysisSettings(studyId, change);
      await mutate(analysisSettingsKey(studyId), created, { revalidate: false });
      return created;
    },
    [mutate],
  );
}
