import {
  formatNumber,
  UNIT_SPACE,
  type CalibrationCheckView,
  type CalibrationCheckKey,
  type CalibrationState,
} from '@gyre/shared';

/** What each compared value is, in a reader's words. */
export const CHECK_LABELS: Record<CalibrationCheckKey, string> = {
  restPafHz: 'Resting peak alpha frequency',
  taskBaselineHz: 'Task: frequency before onset',
  taskDeltaFHz: 'Task: change after onset (Δf)',
  taskTrialsKept: 'Task: onsets kept',
};

export const STATE_WORDS: Record<CalibrationState, string> = {
  queued: 'Waiting',
  computing: 'Computing',
  passed: 'Passed',
  failed: 'Failed',
};

/** A compared value at three decimals (the tolerances are a few hundredths of a hertz). */
export function checkValue(check: CalibrationCheckView, value: number | null): string {
  if (value === null) return 'no value';
  if (check.unit === 'trials') return String(value);
  return `${formatNumber(value, 3, { signed: check.key === 'taskDeltaFHz' })}${UNIT_SPACE}Hz`;
}

export function checkTolerance(check: CalibrationCheckView): string {
  if (check.unit === 'trials') return 'exact';
  return `±${formatNumber(check.tolerance, 3)}${UNIT_SPACE}Hz`;
}
