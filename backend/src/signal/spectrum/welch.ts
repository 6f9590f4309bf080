import { dftPlan } from '../fft/dft-any-length';

export interface WelchOptions {
  sampleRateHz: number;
  /** Segment length in s (default 4: 0.25 Hz resolution, docs/method.md §4). */
  segmentS?: number;
  /** Overlap of consecutive segments as a fraction of a segment (default 0.5). */
  overlapFraction?: number;
}

export interface PowerSpectrum {
  /** Bin frequencies k·fs/nperseg in Hz, k = 0 … nperseg/2. */
  frequencyHz: Float64Array;
  /** One-sided power spectral density in (unit)²/Hz, e.g. µV²/Hz. */
  powerPerHz: Float64Array;
  segmentCount: number;
  segmentSamples: number;
}

/**
 * Power spectral density by Welch's method (Welch 1967, "The use of fast Fourier
 * transform for the estimation of power spectra", IEEE Trans. Audio Electroacoust.
 * 15:70–73): segments of `segmentS` with `overlapFraction` overlap, each with its mean
 * removed and a periodic Hann window w[n] = 0.5 − 0.5·cos(2πn/L); the periodograms
 * |DFT|²/(fs·Σw²) are averaged and folded to one side (×2 except at 0 and fs/2).
 * These are the settings of `scipy.signal.welch(x, fs, window='hann', nperseg=L,
 * noverlap=L/2, detrend='constant', scaling='density')` (scipy docs), which the
 * tests compare against.
 */
export function welchPowerSpectrum(
  samples: Float32Array | Float64Array,
  options: WelchOptions,
): PowerSpectrum {
  const fs = options.sampleRateHz;
  if (!(fs > 0)) throw new RangeError(`sampleRateHz: expected a positive rate, got ${fs}`);
  const segmentS = options.segmentS ?? 4;
  const segment = Math.round(segmentS * fs);
  const overlapFraction = options.overlapFraction ?? 0.5;
  if (!(overlapFraction >= 0 && overlapFraction < 1)) {
    throw new RangeError(`overlapFraction: expected a value in [0, 1), got ${overlapFraction}`);
  }
  if (!Number.isFinite(segment) || segment < 2) {
    throw new RangeError(`segmentS: ${segmentS} s gives fewer than 2 samples`);
  }
  if (samples.length < segment) {
    throw new RangeError(
      `samples: Welch needs at least one segment of ${segment} samples (${segmentS} s), got ${samples.length}`,
    );
  }
  const overlap = Math.floor(segment * overlapFraction);
  const step = segment - overlap;
  const window = new Float64Array(segment);
  let windowPower = 0;
  for (let i = 0; i < segment; i++) {
    window[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / segment);
    windowPower += window[i] * window[i];
  }
  const bins = Math.floor(segment / 2) + 1;
  const power = new Float64Array(bins);
  const plan = dftPlan(segment);
  const scratch = plan.createScratch();
  const input = new Float64Array(2 * segment);
  const output = new Float64Array(2 * segment);
  const segmentCount = Math.floor((samples.length - segment) / step) + 1;

  // Two real segments a, b share one complex transform Z of a + i·b (common practice):
  // A[k] = (Z[k] + conj Z[n−k])/2 and B[k] = (Z[k] − conj Z[n−k])/(2i), so
  // |A[k]|² + |B[k]|² = (|Z[k]|² + |Z[n−k]|²)/2, which also holds for a last segment
  // alone (b = 0, B = 0).
  for (let s = 0; s < segmentCount; s += 2) {
    fillSegment(samples, s * step, segment, window, input, 0);
    if (s + 1 < segmentCount) fillSegment(samples, (s + 1) * step, segment, window, input, 1);
    else for (let i = 0; i < segment; i++) input[2 * i + 1] = 0;
    plan.forward(input, output, scratch);
    for (let k = 0; k < bins; k++) {
      const j = k === 0 ? 0 : segment - k;
      const zr = output[2 * k];
      const zi = output[2 * k + 1];
      const cr = output[2 * j];
      const ci = output[2 * j + 1];
      power[k] += 0.5 * (zr * zr + zi * zi + cr * cr + ci * ci);
    }
  }
  const scale = 1 / (fs * windowPower * segmentCount);
  const frequencyHz = new Float64Array(bins);
  for (let k = 0; k < bins; k++) {
    const fold = k === 0 || (segment % 2 === 0 && k === bins - 1) ? 1 : 2;
    power[k] *= scale * fold;
    frequencyHz[k] = (k * fs) / segment;
  }
  return { frequencyHz, powerPerHz: power, segmentCount, segmentSamples: segment };
}

function fillSegment(
  samples: Float32Array | Float64Array,
  start: number,
  length: number,
  window: Float64Array,
  target: Float64Array,
  part: 0 | 1,
): void {
  let mean = 0;
  for (let i = 0; i < length; i++) mean += samples[start + i];
  mean /= length;
  for (let i = 0; i < length; i++) target[2 * i + part] = (samples[start + i] - mean) * window[i];
}

/** Bin-wise mean of spectra with the same bins (e.g. over the channels of a region). */
export function meanSpectrum(spectra: readonly PowerSpectrum[]): PowerSpectrum {
  if (spectra.length === 0) throw new RangeError('spectra: expected at least one spectrum');
  const first = spectra[0];
  const power = new Float64Array(first.powerPerHz.length);
  for (const s of spectra) {
    if (s.powerPerHz.length !== power.length || s.segmentSamples !== first.segmentSamples) {
      throw new RangeError('spectra: every spectrum must have the same bins to be averaged');
    }
    for (let k = 0; k < power.length; k++) power[k] += s.powerPerHz[k] / spectra.length;
  }
  return { ...first, frequencyHz: first.frequencyHz.slice(), powerPerHz: power };
}
