import type { CalibrationCheckView } from '@gyre/shared';
import type { RunSummary } from '../signal/pipeline/run-summary';
import type { CalibrationTolerances, CalibrationTruth } from './calibration-signal';

/** What the two computations of a calibration run gave (their stored summaries). */
export interface CalibrationComputed {
  rest: Pick<RunSummary, 'rest'>;
  task: Pick<RunSummary, 'roi'>;
}

function check(
  key: CalibrationCheckView['key'],
  unit: CalibrationCheckView['unit'],
  expected: number,
  computed: number | null,
  tolerance: number,
): CalibrationCheckView {
  const passed =
    computed !== null && Number.isFinite(computed) && Math.abs(computed - expected) <= tolerance;
  return { key, unit, expected, computed, tolerance, passed };
}

/**
 * Computed vs known, value by value (docs/method.md, "Calibration run"): the resting PAF and
 * the task's baseline frequency within half a Welch bin; the task's Δf within the fixed floor
 * plus the half-width of the run's own 95 % bootstrap interval; every onset kept, exactly. A
 * missing value fails its check.
 */
export function compareCalibration(
  truth: CalibrationTruth,
  tolerances: CalibrationTolerances,
  computed: CalibrationComputed,
): CalibrationCheckView[] {
  const roi = computed.task.roi;
  const ci = roi?.ciHz ?? null;
  const ciHalfWidth = ci === null ? 0 : Math.abs(ci[1] - ci[0]) / 2;
  return [
    check('restPafHz', 'Hz', truth.pafHz, computed.rest.rest?.pafHz ?? null, tolerances.pafHz),
    check('taskBaselineHz', 'Hz', truth.baselineHz, roi?.baselineHz ?? null, tolerances.baselineHz),
    check(
      'taskDeltaFHz',
      'Hz',
      truth.deltaFHz,
      roi?.deltaFHz ?? null,
      tolerances.deltaFHz + ciHalfWidth,
    ),
    check('taskTrialsKept', 'trials', truth.trialsKept, roi?.trialsKept ?? null, 0),
  ];
}
