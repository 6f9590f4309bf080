import {
  visitScheduleStatus,
  type PlannedVisitWindow,
  type StudyGroupView,
  type TrajectoryView,
  type ParticipantListItem,
  type ParticipantView,
  type VisitView,
} from '@gyre/shared';
import { SITE, STUDY } from '../../../test/fixtures';

// Generated test data: invented participants and one participant's three visits, two groups.

export const GROUPS: StudyGroupView[] = ['Arm A', 'Arm B'].map((name, i) => ({
  id: `g-${i + 1}`,
  studyId: STUDY.id,
  name,
  description: '',
  createdAt: '2025-01-06T09:00:00.000Z',
  updatedAt: '2025-01-06T09:00:00.000Z',
}));

export function participant(index: number): ParticipantView {
  return {
    id: `p-${index}`,
    studyId: STUDY.id,
    siteId: SITE.id,
    code: `AC-${String(index).padStart(4, '0')}`,
    enrolmentDate: index % 2 === 0 ? '2024-01-10' : null,
    groupId: index % 2 === 0 ? GROUPS[index % 4 === 0 ? 0 : 1].id : null,
    createdAt: `2025-01-${String((index % 28) + 1).padStart(2, '0')}T09:00:00.000Z`,
    updatedAt: '2025-03-01T09:00:00.000Z',
  };
}

export const PARTICIPANT = participant(42);

/**
 * A row of the participants list: every third participant has no visit yet; the others have
 * `index % 4 + 1` visits, a PAF of 9 + index/100 Hz at their latest visit, a Δf of
 * −index/100 Hz, an open flag when the index is a multiple of 7, and a report that is signed,
 * sent or a draft in turn.
 */
export function participantRow(
  index: number,
  site: { id: string; name: string } = SITE,
): ParticipantListItem {
  const base = { ...participant(index), siteId: site.id };
  const group = GROUPS.find((g) => g.id === base.groupId)?.name ?? null;
  if (index % 3 === 0) {
    return {
      ...base,
      siteName: site.name,
      groupName: group,
      visitCount: 0,
      latestPaf: null,
      latestDeltaF: null,
      openFlags: 0,
      latestVisit: null,
    };
  }
  const visits = (index % 4) + 1;
  const label = `Month ${(visits - 1) * 6}`;
  const visitId = `v-${index}-${visits}`;
  const states = ['signed', 'sent', 'draft'] as const;
  const state = states[index % 3];
  return {
    ...base,
    siteName: site.name,
    groupName: group,
    visitCount: visits,
    latestPaf: { hz: 9 + index / 100, visitId, visitLabel: label },
    latestDeltaF: { hz: -index / 100, visitId, visitLabel: label },
    openFlags: index % 7 === 0 ? 1 : 0,
    latestVisit: {
      id: visitId,
      label,
      visitDate: '2025-06-01',
      report: { state, latestRevision: state === 'draft' ? null : 1 },
    },
  };
}

/** Month 12 has a narrow window (±3 days), so its visit on day 371 is late. */
const PLANNED: Record<string, PlannedVisitWindow> = {
  Baseline: {
    id: 'pv-0',
    name: 'Baseline',
    targetDay: 0,
    windowBeforeDays: 0,
    windowAfterDays: 14,
  },
  'Month 6': {
    id: 'pv-6',
    name: 'Month 6',
    targetDay: 182,
    windowBeforeDays: 14,
    windowAfterDays: 14,
  },
  'Month 12': {
    id: 'pv-12',
    name: 'Month 12',
    targetDay: 365,
    windowBeforeDays: 3,
    windowAfterDays: 3,
  },
};

function visit(id: string, label: string, visitDate: string): VisitView {
  return {
    id,
    participantId: PARTICIPANT.id,
    studyId: STUDY.id,
    siteId: SITE.id,
    label,
    visitDate,
    plannedVisitId: PLANNED[label].id,
    schedule: visitScheduleStatus({
      visitDate,
      enrolmentDate: PARTICIPANT.enrolmentDate,
      planned: PLANNED[label],
    }),
    createdAt: `${visitDate}T08:00:00.000Z`,
    updatedAt: `${visitDate}T08:00:00.000Z`,
  };
}

export const VISITS: VisitView[] = [
  visit('v-1', 'Baseline', '2024-01-10'),
  visit('v-2', 'Month 6', '2024-07-12'),
  visit('v-3', 'Month 12', '2025-01-15'),
];

export const TRAJECTORY: TrajectoryView = {
  participantId: PARTICIPANT.id,
  visits: [
    {
      visitId: 'v-1',
      label: 'Baseline',
      date: '2024-01-10',
      pafHz: 10.304,
      cogHz: 10.1,
      deltaFHz: -0.1,
      pafChangeHz: 0,
      cogChangeHz: 0,
      deltaFChangeHz: 0,
      flagged: false,
      doubts: [],
    },
    {
      visitId: 'v-2',
      label: 'Month 6',
      date: '2024-07-12',
      pafHz: 10.1,
      cogHz: 10.02,
      deltaFHz: -0.254,
      pafChangeHz: -0.204,
      cogChangeHz: -0.08,
      deltaFChangeHz: -0.154,
      flagged: true,
      doubts: ['Δf from 2 of 3 region-of-interest channels; left out: EEG Pz-REF (saturated).'],
    },
  ],
  // A study whose rule allows a trend from two visits 90 days apart (these are 184 days apart).
  trendRule: { minVisits: 2, minSpanDays: 90 },
  trends: {
    paf: { slopeHzPerYear: -0.4, reason: null, visits: 2, spanDays: 184 },
    cog: { slopeHzPerYear: -0.16, reason: null, visits: 2, spanDays: 184 },
    deltaF: { slopeHzPerYear: -0.3, reason: null, visits: 2, spanDays: 184 },
  },
  slopesHzPerYear: { paf: -0.4, cog: -0.16, deltaF: -0.3 },
};

/** The same two visits under the default rule (3 visits over 90 days): no slope, and why. */
export const TRAJECTORY_TOO_FEW: TrajectoryView = {
  ...TRAJECTORY,
  trendRule: { minVisits: 3, minSpanDays: 90 },
  trends: {
    paf: { slopeHzPerYear: null, reason: 'too-few-visits', visits: 2, spanDays: 184 },
    cog: { slopeHzPerYear: null, reason: 'too-few-visits', visits: 2, spanDays: 184 },
    deltaF: { slopeHzPerYear: null, reason: 'too-few-visits', visits: 2, spanDays: 184 },
  },
  slopesHzPerYear: { paf: null, cog: null, deltaF: null },
};
