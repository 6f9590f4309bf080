import { PowerSpectrum } from '../spectrum/welch';

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
 * Share of samples at the physical minimum or maximum of the signal, where the
 * amplifier or the converter clips (within 0.1 % of the range, common practice).
 */
export function saturatedShare(
  samples: Float32Array | Float64Array,
  physicalRange: { min: number; max: number },
): number {
  if (samples.length === 0) return 0;
  const tolerance = Math.abs(physicalRange.max - physicalRange.min) * 1e-3;
  let count = 0;
  for (let i = 0; i < samples.length; i++) {
    const v = samples[i];
    if (v <= physicalRange.min + tolerance || v >= physicalRange.max - tolerance) count++;
  }
  return count / samples.length;
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
  /** Share of clipped samples above which a channel counts as saturated (default 0.01). */
  saturatedAboveShare?: number;
}

export const DEFAULT_QUALITY_THRESHOLDS: Required<ChannelQualityThresholds> = {
  flatBelowUv: 0.5,
  saturatedAboveShare: 0.01,
};

export interface ChannelQuality {
  label: string;
  standardDeviationUv: number | null;
  flat: boolean;
  saturatedShare: number | null;
  saturated: boolean;
  lineNoiseRatio50Hz: number | null;
  lineNoiseRatio60Hz: number | null;
  /** Share of raw instantaneous-frequency values outside the band (phase slips). */
  phaseSlipShare: number | null;
}

/** Flat and saturation checks of one channel (METHOD.md §6). */
export function channelQuality(
  signal: {
    label: string;
    samples: Float32Array;
    physicalDimension?: string;
    physicalMin?: number;
    physicalMax?: number;
  },
  thresholds: ChannelQualityThresholds = {},
): Pick<ChannelQuality, 'label' | 'standardDeviationUv' | 'flat' | 'saturatedShare' | 'saturated'> {
  const t = { ...DEFAULT_QUALITY_THRESHOLDS, ...thresholds };
  const toUv = microvoltsPerUnit(signal.physicalDimension ?? 'uV');
  const sd = standardDeviation(signal.samples);
  const sdUv = toUv === null ? null : sd * toUv;
  const share =
    signal.physicalMin !== undefined && signal.physicalMax !== undefined
      ? saturatedShare(signal.samples, { min: signal.physicalMin, max: signal.physicalMax })
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
