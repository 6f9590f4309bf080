import type { ChannelQualityView, QualityView } from '@gyre/shared';
import { PowerSpectrum } from '../spectrum/welch';
import type { AnalysisSignal } from '../pipeline/analysis.types';

/** Factor from a signal's physical unit to µV, or null for a unit Gyre does not know. */
export function microvoltsPerUnit(physicalDimension: string): number | null {
  const unit = physicalDimension.trim().replace('μ', 'µ');
  switch (unit) {
    case 'uV':
    case 'µV':
    case 'UV':
      return 1;
    case 'mV':
      return 1e3;
    case 'V':
      return 1e6;
    case 'nV':
      return 1e-3;
    default:
      return null;
  }
}

/** Population standard deviation of the samples (same unit). */
export function standardDeviation(samples: Float32Array | Float64Array): number {
  const n = samples.length;
  if (n === 0) return 0;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += samples[i];
  mean /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (samples[i] - mean) ** 2;
  return Math.sqrt(ss / n);
}

/**
 * The converter's range of one signal: physical values of its lowest and highest digital
 * value (EDF: physicalMin/Max written for digitalMin/Max, Kemp et al. 1992).
 */
export interface ConverterRange {
  physicalMin: number;
  physicalMax: number;
  /** Lowest digital value; default −32768, the EDF 16-bit floor (Kemp et al. 1992). */
  digitalMin?: number;
  /** Highest digital value; default 32767, the EDF 16-bit ceiling (Kemp et al. 1992). */
  digitalMax?: number;
}

/** The 16-bit two's-complement range of EDF samples (Kemp et al. 1992). */
export const EDF_DIGITAL_RANGE: readonly [number, number] = [-32768, 32767];

/**
 * Shortest run of consecutive samples at one rail of the converter that counts as clipping:
 * 5 samples (common practice). A smooth rhythm whose header range was written at or just
 * above its peak touches the rail for a sample or two at most; an amplifier or converter
 * that saturates sits there for many.
 */
export const SATURATION_MIN_RUN_SAMPLES = 5;

/**
 * A channel is saturated when its rail runs (see `SATURATION_MIN_RUN_SAMPLES`) cover more
 * than this share of its samples: 1 % (common practice).
 */
export const SATURATION_MAX_SHARE = 0.01;

/**
 * One quantisation step in physical units: (pmax − pmin) / (dmax − dmin), the gain of
 * Kemp et al. 1992's physical-value formula.
 */
export function quantisationStep(range: ConverterRange): number {
  const dmin = range.digitalMin ?? EDF_DIGITAL_RANGE[0];
  const dmax = range.digitalMax ?? EDF_DIGITAL_RANGE[1];
  return Math.abs(range.physicalMax - range.physicalMin) / Math.abs(dmax - dmin);
}

/**
 * Share of samples that lie in runs of at least `minRunSamples` consecutive samples at one
 * rail of the converter. A sample is at a rail when it is within half a quantisation step of
 * physicalMin or physicalMax (its digital value is digitalMin or digitalMax), or beyond it.
 */
export function railRunShare(
  samples: Float32Array | Float64Array,
  range: ConverterRange,
  minRunSamples: number = SATURATION_MIN_RUN_SAMPLES,
): number {
  const n = samples.length;
  if (n === 0) return 0;
  const halfStep = quantisationStep(range) / 2;
  const low = Math.min(range.physicalMin, range.physicalMax) + halfStep;
  const high = Math.max(range.physicalMin, range.physicalMax) - halfStep;
  let inRuns = 0;
  let rail = 0;
  let run = 0;
  for (let i = 0; i <= n; i++) {
    const v = i < n ? samples[i] : NaN;
    const at = v <= low ? -1 : v >= high ? 1 : 0;
    if (at !== 0 && at === rail) {
      run++;
      continue;
    }
    if (rail !== 0 && run >= minRunSamples) inRuns += run;
    rail = at;
    run = at === 0 ? 0 : 1;
  }
  return inRuns / n;
}

/**
 * Line-noise ratio: mean power density within ±1 Hz of the mains frequency over the
 * mean density 2–6 Hz away on both sides (common practice; ≈1 means no line noise).
 * Null when the band does not fit below Nyquist.
 */
export function lineNoiseRatio(spectrum: PowerSpectrum, lineHz: number): number | null {
  const { frequencyHz: f, powerPerHz: p } = spectrum;
  if (lineHz + 6 > f[f.length - 1]) return null;
  let line = 0;
  let lineCount = 0;
  let side = 0;
  let sideCount = 0;
  for (let k = 0; k < f.length; k++) {
    const d = Math.abs(f[k] - lineHz);
    if (d <= 1) {
      line += p[k];
      lineCount++;
    } else if (d >= 2 && d <= 6) {
      side += p[k];
      sideCount++;
    }
  }
  if (lineCount === 0 || sideCount === 0 || !(side > 0)) return null;
  return line / lineCount / (side / sideCount);
}

export interface ChannelQualityThresholds {
  /** Standard deviation below which a channel counts as flat, µV (default 0.5, common practice). */
  flatBelowUv?: number;
  /** Shortest rail run that counts as clipping, samples (default `SATURATION_MIN_RUN_SAMPLES`). */
  saturationMinRunSamples?: number;
  /** Share of samples in rail runs above which a channel is saturated (default `SATURATION_MAX_SHARE`). */
  saturatedAboveShare?: number;
}

export const DEFAULT_QUALITY_THRESHOLDS: Readonly<Required<ChannelQualityThresholds>> = {
  flatBelowUv: 0.5,
  saturationMinRunSamples: SATURATION_MIN_RUN_SAMPLES,
  saturatedAboveShare: SATURATION_MAX_SHARE,
};

/** One channel's checks; `saturatedShare` is the share of samples in runs at the converter's rails (`railRunShare`). */
export type ChannelQuality = ChannelQualityView;

/** The quality checks of a run (docs/method.md §6); the server adds the warnings. */
export type QualityResult = Omit<QualityView, 'warnings'>;

/**
 * Flat and saturation checks of one channel (docs/method.md §6). Saturated: rail runs of at least
 * `saturationMinRunSamples` cover more than `saturatedAboveShare` of the samples.
 */
export function channelQuality(
  signal: Omit<AnalysisSignal, 'sampleRateHz' | 'samplesPerRecord'>,
  thresholds: ChannelQualityThresholds = {},
): Pick<ChannelQuality, 'label' | 'standardDeviationUv' | 'flat' | 'saturatedShare' | 'saturated'> {
  const t = { ...DEFAULT_QUALITY_THRESHOLDS, ...thresholds };
  const toUv = microvoltsPerUnit(signal.physicalDimension ?? 'uV');
  const sd = standardDeviation(signal.samples);
  const sdUv = toUv === null ? null : sd * toUv;
  const share =
    signal.physicalMin !== undefined && signal.physicalMax !== undefined
      ? railRunShare(
          signal.samples,
          {
            physicalMin: signal.physicalMin,
            physicalMax: signal.physicalMax,
            digitalMin: signal.digitalMin,
            digitalMax: signal.digitalMax,
          },
          t.saturationMinRunSamples,
        )
      : null;
  return {
    label: signal.label,
    standardDeviationUv: sdUv,
    flat: sdUv === null ? sd === 0 : sdUv < t.flatBelowUv,
    saturatedShare: share,
    saturated: share !== null && share > t.saturatedAboveShare,
  };
}

/** Median of a list of numbers, null for an empty list. */
export function medianOf(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const s = [...values].sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 === 1 ? s[mid] : (s[mid - 1] + s[mid]) / 2;
}
