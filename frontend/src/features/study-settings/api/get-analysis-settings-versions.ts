import type { AnalysisSettingsView } from '@gyre/shared';
import { withQuery } from '../../../lib/api-client';
import { usePage } from '../../../lib/use-page';
import { analysisSettingsKey } from '../../../lib/analysis-settings';

export const VERSIONS_PAGE_SIZE = 10;

/** `GET /api/studies/:studyId/analysis-settings/versions`: every version, newest first. */
export const analysisSettingsVersionsKey = (studyId: string, page: number) =>
  withQuery(`${analysisSettingsKey(studyId)}/versions`, {
    page,
    pageSize: VERSIONS_PAGE_SIZE,
    order: 'desc',
  });

/** Every page of the versions list, so that a new version refreshes whichever page is shown. */
export const isAnalysisSettingsVersionsKey = (studyId: string) => (key: unknown) =>
  typeof key === 'string' && key.startsWith(`${analysisSettingsKey(studyId)}/versions`);

export function useAnalysisSettingsVersions(studyId: string | null, page: number) {
  return usePage<AnalysisSettingsView>(
    studyId === null ? null : analysisSettingsVersionsKey(studyId, page),
  );
}
