import type { AnalysisSettingsView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/studies/:studyId/analysis-settings`: the study's current settings version. */
export const analysisSettingsKey = (studyId: string) =>
  `/api/studies/${encodeURIComponent(studyId)}/analysis-settings`;

export function getAnalysisSettings(studyId: string): Promise<AnalysisSettingsView> {
  return apiFetch<AnalysisSettingsView>(analysisSettingsKey(studyId));
}

export function useAnalysisSettings(studyId: string | undefined) {
  return useSWR<AnalysisSettingsView>(
    studyId === undefined ? null : analysisSettingsKey(studyId),
    () => getAnalysisSettings(studyId ?? ''),
  );
}
