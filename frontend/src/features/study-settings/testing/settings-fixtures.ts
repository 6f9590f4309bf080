import type { AnalysisSettingsDto } from '@gyre/shared';
import { STUDY } from '../../../test/fixtures';

// Generated test data: an invented study's settings history of two versions.

export const VERSION_1: AnalysisSettingsDto = {
  id: 'set-1',
  studyId: STUDY.id,
  version: 1,
  changes: [],
  reason: 'Defaults written by Gyre',
  createdById: null,
  createdAt: '2025-01-06T09:00:00.000Z',
  bandHz: null,
  method: 'filter',
  morletCycles: 7,
  epochWindowS: [-1, 2],
  baselineWindowS: [-0.5, 0],
  postWindowS: [0.2, 0.8],
  rejectionThresholdUv: 100,
  flagThresholdHz: -0.2,
  roi: ['O1', 'O2', 'Pz'],
  onsetLabel: null,
};

export const VERSION_2: AnalysisSettingsDto = {
  ...VERSION_1,
  id: 'set-2',
  version: 2,
  bandHz: [8, 12],
  postWindowS: [0.3, 0.9],
  changes: [
    { field: 'bandHz', before: null, after: [8, 12] },
    { field: 'postWindowS', before: [0.2, 0.8], after: [0.3, 0.9] },
  ],
  reason: 'Later post window after the pilot review',
  createdById: 'user-analyst',
  createdAt: '2025-03-04T10:00:00.000Z',
};
