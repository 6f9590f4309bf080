import type { ParticipantView, TrajectoryDto, VisitView } from '@gyre/shared';
import { SITE, STUDY } from '../../../test/fixtures';

// Generated test data: invented participants and one participant's three visits.

export function participant(index: number): ParticipantView {
  return {
    id: `p-${index}`,
    studyId: STUDY.id,
    siteId: SITE.id,
    code: `AC-${String(index).padStart(4, '0')}`,
    createdAt: `2025-01-${String((index % 28) + 1).padStart(2, '0')}T09:00:00.000Z`,
    updatedAt: '2025-03-01T09:00:00.000Z',
  };
}

export const PARTICIPANT = participant(42);

function visit(id: string, label: string, visitDate: string): VisitView {
  return {
    id,
    participantId: PARTICIPANT.id,
    studyId: STUDY.id,
    siteId: SITE.id,
    label,
    visitDate,
    createdAt: `${visitDate}T08:00:00.000Z`,
    updatedAt: `${visitDate}T08:00:00.000Z`,
  };
}

export const VISITS: VisitView[] = [
  visit('v-1', 'Baseline', '2024-01-10'),
  visit('v-2', 'Month 6', '2024-07-12'),
  visit('v-3', 'Month 12', '2025-01-15'),
];

export const TRAJECTORY: TrajectoryDto = {
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
  slopesHzPerYear: { paf: -0.4, cog: -0.16, deltaF: -0.3 },
};
