import type { AnalysisSettingsChange, AnalysisSettingsDto } from '@gyre/shared';
import { mutate } from 'swr';
import { apiSend } from '../../../lib/api-client';
import { analysisSettingsKey } from './get-analysis-settings';

/** `POST /api/studies/:studyId/analysis-settings`: saves a new settings version. */
export async function createAnalysisSettings(
  studyId: string,
  change: AnalysisSettingsChange,
): Promise<AnalysisSettingsDto> {
  const created = await apiSend<AnalysisSettingsDto>(analysisSettingsKey(studyId), 'POST', change);
  await mutate(analysisSettingsKey(studyId));
  return created;
}
