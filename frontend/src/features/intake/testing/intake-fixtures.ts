import type {
  DueListView,
  Page,
  ParticipantView,
  PlannedVisitView,
  RecordingView,
  StudyGroupView,
  VisitView,
} from '@gyre/shared';
import { http, HttpResponse } from 'msw';
import { readyRecording, SITE, STUDY } from '../../../test/fixtures';
import { server } from '../../../test/msw-server';
import { errorResponse } from '../../../test/error-response';

// Generated test data: one invented participant with one visit, a two-visit schedule, two groups.

export const GROUPS: StudyGroupView[] = [
  {
    id: 'g-1',
    studyId: STUDY.id,
    name: 'Arm A',
    description: '',
    createdAt: '2025-01-06T09:00:00.000Z',
    updatedAt: '2025-01-06T09:00:00.000Z',
  },
  {
    id: 'g-2',
    studyId: STUDY.id,
    name: 'Arm B',
    description: '',
    createdAt: '2025-01-06T09:00:00.000Z',
    updatedAt: '2025-01-06T09:00:00.000Z',
  },
];

const planned = (
  id: string,
  name: string,
  targetDay: number,
  before: number,
  after: number,
  position: number,
): PlannedVisitView => ({
  id,
  studyId: STUDY.id,
  name,
  targetDay,
  windowBeforeDays: before,
  windowAfterDays: after,
  position,
  createdAt: '2025-01-06T09:00:00.000Z',
  updatedAt: '2025-01-06T09:00:00.000Z',
});

export const SCHEDULE: PlannedVisitView[] = [
  planned('pv-0', 'Baseline', 0, 0, 14, 0),
  planned('pv-12', 'Week 12', 84, 14, 14, 1),
];

export const participant: ParticipantView = {
  id: 'p-1',
  studyId: STUDY.id,
  siteId: SITE.id,
  code: 'AC-0042',
  enrolmentDate: '2025-01-20',
  groupId: 'g-1',
  createdAt: '2025-02-01T10:00:00.000Z',
  updatedAt: '2025-02-01T10:00:00.000Z',
};

export const visit: VisitView = {
  id: 'v-1',
  participantId: participant.id,
  studyId: STUDY.id,
  siteId: SITE.id,
  label: 'V1',
  visitDate: '2025-02-03',
  plannedVisitId: null,
  schedule: {
    plannedVisitId: null,
    plannedVisitName: null,
    studyDay: 14,
    targetDay: null,
    daysFromTarget: null,
    window: 'unplanned',
  },
  createdAt: '2025-02-03T10:00:00.000Z',
  updatedAt: '2025-02-03T10:00:00.000Z',
};

export const page = <T>(items: T[]): Page<T> => ({
  items,
  total: items.length,
  page: 1,
  pageSize: 200,
});

export function recording(change: Partial<RecordingView>): RecordingView {
  return readyRecording({ participantId: participant.id, visitId: visit.id, ...change });
}

export const NOTHING_DUE: DueListView = {
  studyId: STUDY.id,
  asOf: '2025-02-03',
  participants: [],
  withoutEnrolmentDate: 0,
};

/** The participant, the visit and the recordings `recordings()` answers at each ask. */
export function useIntakeHandlers(
  recordings: () => RecordingView[],
  due: DueListView = NOTHING_DUE,
) {
  server.use(
    http.get(`/api/studies/${STUDY.id}/planned-visits`, () => HttpResponse.json(SCHEDULE)),
    http.get(`/api/studies/${STUDY.id}/groups`, () => HttpResponse.json(GROUPS)),
    http.get(`/api/studies/${STUDY.id}/due`, () => HttpResponse.json(due)),
    http.get('/api/participants', () => HttpResponse.json(page([participant]))),
    http.get('/api/visits', () => HttpResponse.json(page([visit]))),
    http.get('/api/recordings', () => HttpResponse.json(page(recordings()))),
    // No live stream unless a test serves one: Intake then falls back to asking again.
    http.get('/api/recordings/:id/events', () =>
      errorResponse(404, 'NOT_SERVED', 'No stream in this test.'),
    ),
  );
}

/** Where Intake opens on the visit's upload card and recordings. */
export const visitPath = `/intake?participant=${participant.id}&visit=${visit.id}`;
