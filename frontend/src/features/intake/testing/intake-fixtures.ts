import type { Page, ParticipantView, RecordingDto, VisitView } from '@gyre/shared';
import { http, HttpResponse } from 'msw';
import { SITE, STUDY } from '../../../test/fixtures';
import { server } from '../../../test/msw-server';

// Generated test data: one invented participant with one visit.

export const participant: ParticipantView = {
  id: 'p-1',
  studyId: STUDY.id,
  siteId: SITE.id,
  code: 'AC-0042',
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
  createdAt: '2025-02-03T10:00:00.000Z',
  updatedAt: '2025-02-03T10:00:00.000Z',
};

export const page = <T>(items: T[]): Page<T> => ({
  items,
  total: items.length,
  page: 1,
  pageSize: 200,
});

export function recording(change: Partial<RecordingDto>): RecordingDto {
  return {
    id: 'r-1',
    studyId: STUDY.id,
    siteId: SITE.id,
    participantId: participant.id,
    visitId: visit.id,
    kind: 'resting',
    state: 'ready',
    checksumSha256: 'a'.repeat(64),
    sizeBytes: 1_234_567,
    progressPercent: 100,
    facts: null,
    rejection: null,
    failureMessage: null,
    latestJob: null,
    latestRunId: null,
    kindConfirmed: false,
    warnings: [],
    roiUsage: null,
    replacesId: null,
    replacementReason: null,
    supersededById: null,
    uploadedById: 'user-technician',
    createdAt: '2025-02-03T10:05:00.000Z',
    updatedAt: '2025-02-03T10:06:00.000Z',
    ...change,
  };
}

/** The participant, the visit and the recordings `recordings()` answers at each ask. */
export function useIntakeHandlers(recordings: () => RecordingDto[]) {
  server.use(
    http.get('/api/participants', () => HttpResponse.json(page([participant]))),
    http.get('/api/visits', () => HttpResponse.json(page([visit]))),
    http.get('/api/recordings', () => HttpResponse.json(page(recordings()))),
  );
}

/** Where Intake opens on the visit's upload card and recordings. */
export const visitPath = `/intake?participant=${participant.id}&visit=${visit.id}`;
