import type { AnalysisSettingsValues } from './recordings';

/**
 * A calibration run: Gyre computes its own generated recording with known answers through the
 * normal pipeline and compares (docs/method.md, "Calibration run"). Kept apart from study data.
 */
export type CalibrationState = 'queued' | 'computing' | 'passed' | 'failed';

/** The values compared, in the order they are shown. */
export const CALIBRATION_CHECK_KEYS = [
  'restPafHz',
  'taskBaselineHz',
  'taskDeltaFHz',
  'taskTrialsKept',
] as const;
export type CalibrationCheckKey = (typeof CALIBRATION_CHECK_KEYS)[number];

/** One compared value: what the signal's definition says, what was computed, how close. */
export interface CalibrationCheckView {
  key: CalibrationCheckKey;
  /** Hz, or 'trials' for a count. */
  unit: 'Hz' | 'trials';
  expected: number;
  /** Null when the computation gave no value (e.g. no clear peak). */
  computed: number | null;
  /** Largest accepted |computed − expected|. */
  tolerance: number;
  passed: boolean;
}

export interface CalibrationRunView {
  id: string;
  studyId: string;
  siteId: string;
  siteCode: string;
  state: CalibrationState;
  /** The definition of the calibration signal compared with. */
  signalName: string;
  /** Empty until the run is finished. */
  checks: CalibrationCheckView[];
  /** Why the run failed without values (the computation itself failed), else null. */
  error: string | null;
  /** Gyre's version that computed the run. */
  gyreVersion: string;
  /** The study's analysis settings version the run computed with. */
  settingsVersionId: string;
  settingsVersion: number;
  settings: AnalysisSettingsValues;
  requestedById: string;
  requestedByName: string | null;
  requestedAt: string;
  finishedAt: string | null;
}

/** Starts a calibration run for a site. */
export interface StartCalibrationRequest {
  siteId: string;
}
