import type { AnalysisSettingsDto } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/studies/:studyId/analysis-settings`: the study's current settings version. */
export const analysisSettingsKey = (studyId: string) =>
  `/api/studies/${encodeURIComponent(studyId)}/analysis-settings`;

export function getAnalysisSettings(studyId: string): Promise<AnalysisSettingsDto> {
  return apiFetch<AnalysisSettingsDto>(analysisSettingsKey(studyId));
}

export function useAnalysisSettings(studyId: string | null) {
  return useSWR<AnalysisSettingsDto>(studyId === null ? null : analysisSettingsKey(studyId), () =>
    getAnalysisSettings(studyId ?? ''),
  );
}
