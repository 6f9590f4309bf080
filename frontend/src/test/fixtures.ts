import {
  packRulesFor,
  type AnalysisSettingsValues,
  type AnalysisSettingsView,
  type MeResponse,
  type RecordingView,
  type Role,
} from '@gyre/shared';

// Generated test data: an invented study with two sites and one user per role.
export const STUDY = {
  id: 'study-1',
  code: 'ALPHA-AGE',
  name: 'Alpha in ageing',
  description: '',
  trendMinVisits: 3,
  trendMinSpanDays: 90,
  blindedReview: false,
  createdAt: '2025-01-06T09:00:00.000Z',
  updatedAt: '2025-01-06T09:00:00.000Z',
};
export const SITE = {
  id: 'site-a',
  studyId: STUDY.id,
  code: 'NORTH',
  name: 'North clinic',
  createdAt: '2025-01-06T09:00:00.000Z',
  updatedAt: '2025-01-06T09:00:00.000Z',
};

const NAMES: Record<Role, string> = {
  technician: 'Tomas Tech',
  analyst: 'Ana Lyst',
  monitor: 'Mona Itor',
  coordinator: 'Cora Dinator',
  admin: 'Adam Min',
};

/** What `GET /api/auth/me` answers for a user of `role`, with the real rules of shared/. */
export function meFor(role: Role): MeResponse {
  const studyId = role === 'admin' ? null : STUDY.id;
  const siteId = role === 'technician' || role === 'coordinator' ? SITE.id : null;
  const user = {
    id: `user-${role}`,
    email: `${role}@example.org`,
    name: NAMES[role],
    role,
    studyId,
    siteId,
    state: 'active' as const,
    lastSignInAt: null,
    createdAt: '2025-01-06T09:00:00.000Z',
    updatedAt: '2025-01-06T09:00:00.000Z',
  };
  return {
    user,
    study: studyId === null ? null : STUDY,
    site: siteId === null ? null : SITE,
    rules: packRulesFor({ id: user.id, role, studyId, siteId }),
  };
}

/** The values of version 1 of the study's analysis settings: the defaults Gyre writes. */
export const DEFAULT_SETTINGS_VALUES: AnalysisSettingsValues = {
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
  amplitudeGatePercentile: null,
  cycleDisagreementHz: 0.1,
  compareConditions: null,
};

/** Version 1 of the study's analysis settings (generated test data). */
export const DEFAULT_SETTINGS: AnalysisSettingsView = {
  id: 'set-1',
  studyId: STUDY.id,
  version: 1,
  changes: [],
  reason: 'Defaults written by Gyre',
  createdById: null,
  createdAt: '2025-01-06T09:00:00.000Z',
  ...DEFAULT_SETTINGS_VALUES,
};

/**
 * A resting recording of participant p-1's visit v-1 at the first site, read and ready with
 * nothing in doubt; a test names only what differs.
 */
export function readyRecording(change: Partial<RecordingView> = {}): RecordingView {
  return {
    id: 'r-1',
    studyId: STUDY.id,
    siteId: SITE.id,
    participantId: 'p-1',
    visitId: 'v-1',
    kind: 'resting',
    state: 'ready',
    checksumSha256: 'a'.repeat(64),
    sizeBytes: 1_234_567,
    fileName: 'AC-0042-V1-resting.edf',
    lineFrequencyHz: null,
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
