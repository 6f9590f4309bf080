import type { OverviewCell, OverviewStat, StudyOverviewView } from '@gyre/shared';
import { SITE, STUDY } from '../../../test/fixtures';

// Generated test data: two planned visits, two groups, two sites, three participants.
const cell = (plannedVisitId: string, extra: Partial<OverviewCell>): OverviewCell => ({
  plannedVisitId,
  visitId: null,
  visitDate: null,
  state: 'missing',
  changedSinceSigning: false,
  paf: null,
  cog: null,
  deltaF: null,
  doubts: [],
  ...extra,
});

/** Baseline PAF of AC-0001 and AC-0002, who share both a group (Arm 1) and a site. */
const BASELINE_PAF: Omit<OverviewStat, 'key'> = {
  measure: 'paf',
  plannedVisitId: 'pv-0',
  n: 2,
  mean: 10.0,
  sd: 0.283,
  ciLow: 7.46,
  ciHigh: 12.54,
  doubtful: 1,
};

export const OVERVIEW: StudyOverviewView = {
  studyId: STUDY.id,
  plannedVisits: [
    { id: 'pv-0', name: 'Baseline', targetDay: 0 },
    { id: 'pv-6', name: 'Month 6', targetDay: 182 },
  ],
  groups: [
    { id: 'g-1', name: 'Arm 1' },
    { id: 'g-2', name: 'Arm 2' },
  ],
  sites: [
    { id: SITE.id, name: SITE.name },
    { id: 'site-b', name: 'South clinic' },
  ],
  participants: [
    {
      id: 'p-1',
      code: 'AC-0001',
      siteId: SITE.id,
      groupId: 'g-1',
      unplannedVisits: 0,
      cells: [
        cell('pv-0', { visitId: 'v-1', state: 'signed', paf: 10.2, cog: 10.0, deltaF: -0.2 }),
        cell('pv-6', {
          visitId: 'v-2',
          state: 'computed',
          changedSinceSigning: true,
          paf: 10.0,
          cog: 9.9,
          deltaF: -0.3,
        }),
      ],
    },
    {
      id: 'p-2',
      code: 'AC-0002',
      siteId: SITE.id,
      groupId: 'g-1',
      unplannedVisits: 0,
      cells: [
        cell('pv-0', {
          visitId: 'v-3',
          state: 'reviewed',
          paf: 9.8,
          cog: 9.7,
          deltaF: -0.4,
          doubts: ['Δf in the 8–13 Hz band: the visit has no resting IAF to follow.'],
        }),
        cell('pv-6', {}),
      ],
    },
    {
      id: 'p-3',
      code: 'AC-0003',
      siteId: 'site-b',
      groupId: 'g-2',
      unplannedVisits: 1,
      cells: [cell('pv-0', { visitId: 'v-5', state: 'uploaded' }), cell('pv-6', {})],
    },
  ],
  byGroup: [
    { ...BASELINE_PAF, key: 'g-1' },
    {
      measure: 'paf',
      plannedVisitId: 'pv-6',
      key: 'g-1',
      n: 1,
      mean: 10.0,
      sd: null,
      ciLow: null,
      ciHigh: null,
      doubtful: 0,
    },
  ],
  bySite: [{ ...BASELINE_PAF, key: SITE.id }],
  siteQuality: [
    {
      siteId: SITE.id,
      siteName: SITE.name,
      uploads: 8,
      rejected: 2,
      rejectionRate: 0.25,
      runs: 5,
      epochsDroppedShare: 0.125,
      lineNoiseRatio50Hz: 1.8,
      lineNoiseRatio60Hz: 1.02,
      phaseSlipShare: 0.031,
      roiChannelsLost: 0.4,
      runsWithoutRoi: 1,
    },
    {
      siteId: 'site-b',
      siteName: 'South clinic',
      uploads: 1,
      rejected: 0,
      rejectionRate: 0,
      runs: 0,
      epochsDroppedShare: null,
      lineNoiseRatio50Hz: null,
      lineNoiseRatio60Hz: null,
      phaseSlipShare: null,
      roiChannelsLost: null,
      runsWithoutRoi: 0,
    },
  ],
  notes: ['1 visit used the 8–13 Hz band for Δf because the visit has no resting IAF.'],
};
