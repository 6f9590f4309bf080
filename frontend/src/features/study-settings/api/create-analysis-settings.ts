import type { AnalysisSettingsChange, AnalysisSettingsView } from '@gyre/shared';
import { useCallback } from 'react';
import { useSWRConfig } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { analysisSettingsKey } from '../../../lib/analysis-settings';
import { isAnalysisSettingsVersionsKey } from './get-analysis-settings-versions';

/** The answer when a new version would equal the current one (409). */
export const ANALYSIS_SETTINGS_UNCHANGED = 'ANALYSIS_SETTINGS_UNCHANGED';

/**
 * `POST /api/studies/:studyId/analysis-settings`: saves a new settings version. It re-runs
 * nothing: runs keep their numbers, and Review says which would change.
 */
export function createAnalysisSettings(
  studyId: string,
  change: AnalysisSettingsChange,
): Promise<AnalysisSettingsView> {
  return apiSend<AnalysisSettingsView>(analysisSettingsKey(studyId), 'POST', change);
}

export function useCreateAnalysisSettings() {
  const { mutate } = useSWRConfig();
  return useCallback(
    async (studyId: string, change: AnalysisSettingsChange) => {
      const created = await createAnalysisSettings(studyId, change);
      await mutate(analysisSettingsKey(studyId), created, { revalidate: false });
      await mutate(isAnalysisSettingsVersionsKey(studyId));
      return created;
    },
    [mutate],
  );
}
