import type { AnalysisSettingsView } from '@gyre/shared';
import { studyPath } from './study-schedule';
import { useRead } from './use-read';

/** `GET /api/studies/:studyId/analysis-settings`: the study's current settings version. */
export const analysisSettingsKey = (studyId: string) => `${studyPath(studyId)}/analysis-settings`;

/** Asks nothing while `studyId` is not known (null or undefined). */
export function useAnalysisSettings(studyId: string | null | undefined) {
  return useRead<AnalysisSettingsView>(
    studyId === null || studyId === undefined ? null : analysisSettingsKey(studyId),
  );
}
