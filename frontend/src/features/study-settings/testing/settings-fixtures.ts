import type { AnalysisSettingsView } from '@gyre/shared';
import { DEFAULT_SETTINGS } from '../../../test/fixtures';

// Generated test data: an invented study's settings history of two versions.

/** Version 1: Gyre's defaults. */
export const VERSION_1: AnalysisSettingsView = DEFAULT_SETTINGS;

export const VERSION_2: AnalysisSettingsView = {
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
