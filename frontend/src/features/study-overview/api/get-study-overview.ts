import type { StudyOverviewView } from '@gyre/shared';
import useSWR from 'swr';
import { apiFetch } from '../../../lib/api-client';

/** `GET /api/studies/:studyId/overview`: courses, group means with 95 % CI, completion, site quality. */
export const studyOverviewKey = (studyId: string) =>
  `/api/studies/${encodeURIComponent(studyId)}/overview`;

export function getStudyOverview(studyId: string): Promise<StudyOverviewView> {
  return apiFetch<StudyOverviewView>(studyOverviewKey(studyId));
}

export function useStudyOverview(studyId: string | null) {
  return useSWR<StudyOverviewView>(studyId === null ? null : studyOverviewKey(studyId), () =>
    getStudyOverview(studyId ?? ''),
  );
}
