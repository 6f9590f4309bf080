/**
 * Cycles of one channel as the cycle-by-cycle approach defines them (Cole & Voytek 2019,
 * "Cycle-by-cycle analysis of neural oscillations", J. Neurophysiol. 122:849–861): the
 * zero-crossings of a narrow-band copy split the signal into rises and decays; the peak is
 * the maximum of the broadband copy between a rising and the next falling zero-crossing, the
 * trough its minimum between a falling and the next rising one; a cycle runs from trough to
 * trough over one peak, and its period gives its frequency. The shape is read from the
 * broadband copy, so a sharp-peaked or asymmetric rhythm keeps its true extrema.
 */

/** One channel's cycles, as parallel arrays (one value per cycle, in time order). */
export interface CycleFeatures {
  count: number;
  /** Start and end trough and the peak between them, fractional sample positions. */
  startTrough: Float64Array;
  peak: Float64Array;
  endTrough: Float64Array;
  /** Trough-to-trough period, s. */
  periodS: Float64Array;
  /** Midpoint of the two troughs, s from the first sample. */
  centreS: Float64Array;
  /** Peak − start trough and peak − end trough, in the signal's unit. */
  riseAmplitude: Float64Array;
  decayAmplitude: Float64Array;
  /** Share of sample steps rising during the rise and falling during the decay, 0…1. */
  monotonicity: Float64Array;
}

/**
 * Position of an extremum at sample `i` refined by the parabola through its two
 * neighbours (common practice): the period is then not rounded to whole samples, which at
 * 250–500 Hz would be 2–4 % of an alpha period per cycle.
 */
function refine(signal: Float64Array, i: number): number {
  if (i <= 0 || i >= signal.length - 1) return i;
  const a = signal[i - 1];
  const b = signal[i];
  const c = signal[i + 1];
  const curvature = a - 2 * b + c;
  if (curvature === 0) return i;
  const offset = (0.5 * (a - c)) / curvature;
  return Math.abs(offset) <= 0.5 ? i + offset : i;
}

function extremum(signal: Float64Array, from: number, to: number, sign: 1 | -1): number {
  let best = from;
  for (let i = from + 1; i < to; i++) if (sign * signal[i] > sign * signal[best]) best = i;
  return best;
}

function monotoneShare(signal: Float64Array, from: number, to: number, sign: 1 | -1): number {
  let steps = 0;
  let monotone = 0;
  for (let i = from; i < to; i++) {
    steps++;
    if (sign * (signal[i + 1] - signal[i]) > 0) monotone++;
  }
  return steps === 0 ? 0 : monotone / steps;
}

/**
 * The cycles of `broadband` (same length and rate as `narrowBand`): zero-crossings of
 * `narrowBand`, extrema of `broadband` between them, trough-to-trough cycles.
 */
export function findCycles(
  narrowBand: Float64Array,
  broadband: Float64Array,
  sampleRateHz: number,
): CycleFeatures {
  const n = narrowBand.length;
  if (broadband.length !== n) {
    throw new RangeError(
      `broadband: expected ${n} samples like narrowBand, got ${broadband.length}`,
    );
  }
  if (!(sampleRateHz > 0)) {
    throw new RangeError(`sampleRateHz: expected a positive rate, got ${sampleRateHz}`);
  }
  // Zero-crossings in time order: +k rising (k−1 below zero, k at or above), −k falling.
  const crossings: number[] = [];
  for (let k = 1; k < n; k++) {
    if (narrowBand[k - 1] < 0 && narrowBand[k] >= 0) crossings.push(k);
    else if (narrowBand[k - 1] > 0 && narrowBand[k] <= 0) crossings.push(-k);
  }
  // Extrema between consecutive crossings, in time order: a peak after a rising crossing,
  // a trough after a falling one.
  const order: { at: number; sign: 1 | -1 }[] = [];
  for (let c = 0; c + 1 < crossings.length; c++) {
    const sign: 1 | -1 = crossings[c] > 0 ? 1 : -1;
    // A crossing that touches zero without passing can repeat a direction: no extremum.
    if (Math.sign(crossings[c + 1]) === sign) continue;
    const from = Math.abs(crossings[c]);
    order.push({ at: extremum(broadband, from, Math.abs(crossings[c + 1]), sign), sign });
  }
  // Every trough followed by a peak and a trough starts a cycle.
  const starts: number[] = [];
  for (let i = 0; i + 2 < order.length; i++) {
    if (order[i].sign === -1 && order[i + 1].sign === 1 && order[i + 2].sign === -1) {
      starts.push(i);
    }
  }
  const count = starts.length;
  const features: CycleFeatures = {
    count,
    startTrough: new Float64Array(count),
    peak: new Float64Array(count),
    endTrough: new Float64Array(count),
    periodS: new Float64Array(count),
    centreS: new Float64Array(count),
    riseAmplitude: new Float64Array(count),
    decayAmplitude: new Float64Array(count),
    monotonicity: new Float64Array(count),
  };
  starts.forEach((i, c) => {
    const [t0, pk, t1] = [order[i].at, order[i + 1].at, order[i + 2].at];
    const start = refine(broadband, t0);
    const end = refine(broadband, t1);
    features.startTrough[c] = start;
    features.peak[c] = refine(broadband, pk);
    features.endTrough[c] = end;
    features.periodS[c] = (end - start) / sampleRateHz;
    features.centreS[c] = (start + end) / 2 / sampleRateHz;
    features.riseAmplitude[c] = broadband[pk] - broadband[t0];
    features.decayAmplitude[c] = broadband[pk] - broadband[t1];
    const rising = monotoneShare(broadband, t0, pk, 1);
    const falling = monotoneShare(broadband, pk, t1, -1);
    const steps = t1 - t0;
    features.monotonicity[c] = steps > 0 ? (rising * (pk - t0) + falling * (t1 - pk)) / steps : 0;
  });
  return features;
}
