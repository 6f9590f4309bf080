/**
 * What the results routes send: the stored run's numbers shaped for what the screens draw.
 * Series are rounded as `RESULT_SERIES_DECIMALS` says (the one place the rule is written);
 * the raster and each channel's curve have routes of their own. The stored run is never
 * touched: the visit report reads `toResultsView` at full precision.
 */
import {
  RESULT_SERIES_DECIMALS,
  SPECTRUM_POWER_SIGNIFICANT_DIGITS,
  type ConditionDifferenceView,
  type ConditionStatsView,
  type CycleEstimateView,
  type OnsetCurveView,
  type RecordingResultsView,
  type TaskResultsView,
  type TrialRasterView,
} from '@gyre/shared';
import type { RunSummary } from '../jobs/worker/worker-tasks';

/**
 * `value` to `decimals` places, half away from zero (the nearest double to the decimal, so
 * JSON writes at most `decimals` digits after the point); non-finite values become null.
 */
export function roundTo(value: number, decimals: number): number | null {
  if (!Number.isFinite(value)) return null;
  const scale = 10 ** decimals;
  const rounded = Math.sign(value) * (Math.round(Math.abs(value) * scale) / scale);
  // -0 and 0 are one value; JSON would write both as 0 anyway.
  return rounded === 0 ? 0 : rounded;
}

/** `value` to `digits` significant digits (ECMAScript Number.prototype.toPrecision). */
export function roundSignificant(value: number, digits: number): number | null {
  if (!Number.isFinite(value)) return null;
  return Number(value.toPrecision(digits));
}

function roundedAll(values: ArrayLike<number | null>, decimals: number): Array<number | null> {
  return Array.from(values, (v) => (v === null ? null : roundTo(v, decimals)));
}

/** Axes hold no gaps: a non-finite value there is a bug upstream, never silently a null. */
function roundedAxis(values: ArrayLike<number>, decimals: number, name: string): number[] {
  return Array.from(values, (v, i) => {
    const rounded = roundTo(v, decimals);
    if (rounded === null) throw new Error(`results: ${name}[${i}] is ${v}, not a number`);
    return rounded;
  });
}

export function roundedCurve(curve: OnsetCurveView): OnsetCurveView {
  const d = RESULT_SERIES_DECIMALS.curveHz;
  return {
    name: curve.name,
    meanHz: roundedAll(curve.meanHz, d),
    ciLowHz: roundedAll(curve.ciLowHz, d),
    ciHighHz: roundedAll(curve.ciHighHz, d),
  };
}

/** The results answer: the full-precision DTO with its series rounded. */
export function roundedResults(full: RecordingResultsView): RecordingResultsView {
  const task = full.task;
  const rest = full.rest;
  return {
    ...full,
    task:
      task === null
        ? null
        : {
            ...task,
            timeS: roundedAxis(task.timeS, RESULT_SERIES_DECIMALS.timeS, 'timeS'),
            roi: roundedCurve(task.roi),
            conditionCurves: task.conditionCurves.map(roundedCurve),
          },
    rest:
      rest === null
        ? null
        : {
            ...rest,
            frequencyHz: roundedAxis(
              rest.frequencyHz,
              RESULT_SERIES_DECIMALS.spectrumFrequencyHz,
              'frequencyHz',
            ),
            powerUv2PerHz: rest.powerUv2PerHz.map((v, i) => {
              const rounded = roundSignificant(v, SPECTRUM_POWER_SIGNIFICANT_DIGITS);
              if (rounded === null) throw new Error(`results: powerUv2PerHz[${i}] is ${v}`);
              return rounded;
            }),
          },
  };
}

/** A channel's onset curve, rounded; null when the run has no curve for that channel. */
export function channelCurveOf(
  summary: RunSummary,
  series: Record<string, Float64Array>,
  channel: string,
): OnsetCurveView | null {
  if (summary.task === null || !summary.task.curveChannels.includes(channel)) return null;
  return roundedCurve(curveOf(series, `channel:${channel}`, channel));
}

/** The region of interest's trial raster and per-trial Δf, rounded; null without a task. */
export function trialRasterOf(
  summary: RunSummary,
  series: Record<string, Float64Array>,
): TrialRasterView | null {
  if (summary.task === null) return null;
  const { rasterTrials, rasterPoints } = summary.task;
  const values = series.raster ?? new Float64Array(0);
  if (values.length !== rasterTrials * rasterPoints) {
    throw new Error(
      `results: the raster holds ${values.length} values, expected ${rasterTrials} × ${rasterPoints}`,
    );
  }
  return {
    timeS: roundedAxis(
      series['raster:timeS'] ?? new Float64Array(0),
      RESULT_SERIES_DECIMALS.timeS,
      'raster timeS',
    ),
    trialOnsetsS: roundedAxis(
      summary.task.trialOnsetsS,
      RESULT_SERIES_DECIMALS.trialOnsetsS,
      'trialOnsetsS',
    ),
    trialDeltaFHz: roundedAll(
      series.trialDeltaFHz ?? new Float64Array(0),
      RESULT_SERIES_DECIMALS.trialDeltaFHz,
    ),
    trials: rasterTrials,
    points: rasterPoints,
    valuesHz: roundedAll(values, RESULT_SERIES_DECIMALS.rasterHz),
  };
}

/** NaN (no value) becomes null in JSON. */
export function numbers(values: Float64Array | undefined): Array<number | null> {
  if (values === undefined) return [];
  return Array.from(values, (v) => (Number.isFinite(v) ? v : null));
}

/** A stored curve at full precision (`<prefix>:mean|ciLow|ciHigh`). */
export function curveOf(
  series: Record<string, Float64Array>,
  prefix: string,
  name: string,
): OnsetCurveView {
  return {
    name,
    meanHz: numbers(series[`${prefix}:mean`]),
    ciLowHz: numbers(series[`${prefix}:ciLow`]),
    ciHighHz: numbers(series[`${prefix}:ciHigh`]),
  };
}

/**
 * The conditions and cycle-by-cycle parts of a stored task summary. Runs stored before these
 * were computed lack the keys: each missing one reads as empty / null.
 */
interface StoredTaskDepth {
  conditions?: ConditionStatsView[];
  conditionDifference?: ConditionDifferenceView | null;
  /** Labels whose curves are stored as `condition:<label>:mean|ciLow|ciHigh`. */
  conditionCurves?: string[];
  cycles?: CycleEstimateView | null;
}

type TaskDepthView = Pick<
  TaskResultsView,
  'conditions' | 'conditionCurves' | 'conditionDifference' | 'cycles'
>;

/** A task summary's conditions, their curves (full precision) and the cycle-by-cycle estimate. */
export function taskDepthOf(
  task: NonNullable<RunSummary['task']>,
  series: Record<string, Float64Array>,
): TaskDepthView {
  const depth = task as NonNullable<RunSummary['task']> & StoredTaskDepth;
  return {
    conditions: depth.conditions ?? [],
    conditionCurves: (depth.conditionCurves ?? []).map((label) =>
      curveOf(series, `condition:${label}`, label),
    ),
    conditionDifference: depth.conditionDifference ?? null,
    cycles: depth.cycles ?? null,
  };
}
