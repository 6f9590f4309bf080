import type { StudyOverviewView } from '@gyre/shared';
import { useRead } from '../../../lib/use-read';

/** `GET /api/studies/:studyId/overview`: courses, group means with 95 % CI, completion, site quality. */
export const studyOverviewKey = (studyId: string) =>
  `/api/studies/${encodeURIComponent(studyId)}/overview`;

export function useStudyOverview(studyId: string | null) {
  return useRead<StudyOverviewView>(studyId === null ? null : studyOverviewKey(studyId));
}
