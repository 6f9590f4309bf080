import type { PlannedVisitView, StudyGroupView } from '@gyre/shared';
import { http, HttpResponse } from 'msw';
import { STUDY } from '../../../test/fixtures';
import { server } from '../../../test/msw-server';

// Generated test data: an invented study's three planned visits and two groups.

const at = '2025-01-06T09:00:00.000Z';

export const PLANNED_VISITS: PlannedVisitView[] = [
  ['pv-0', 'Baseline', 0, 0, 7],
  ['pv-12', 'Week 12', 84, 14, 14],
  ['pv-26', 'Week 26', 182, 14, 14],
].map(([id, name, targetDay, before, after], position) => ({
  id: id as string,
  studyId: STUDY.id,
  name: name as string,
  targetDay: targetDay as number,
  windowBeforeDays: before as number,
  windowAfterDays: after as number,
  position,
  createdAt: at,
  updatedAt: at,
}));

export const GROUPS: StudyGroupView[] = [
  {
    id: 'g-1',
    studyId: STUDY.id,
    name: 'Arm A',
    description: 'Training',
    createdAt: at,
    updatedAt: at,
  },
  { id: 'g-2', studyId: STUDY.id, name: 'Arm B', description: '', createdAt: at, updatedAt: at },
];

/** The schedule and groups of `STUDY`, read-only. */
export function serveSchedule(planned = PLANNED_VISITS, groups = GROUPS) {
  server.use(
    http.get(`/api/studies/${STUDY.id}/planned-visits`, () => HttpResponse.json(planned)),
    http.get(`/api/studies/${STUDY.id}/groups`, () => HttpResponse.json(groups)),
  );
}
