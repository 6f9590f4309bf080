/**
 * Which cycles lie in an oscillatory burst, by the four cycle criteria of Cole & Voytek
 * 2019 (J. Neurophysiol. 122:849–861): amplitude fraction, amplitude consistency, period
 * consistency and monotonicity, each above a threshold, for at least a minimum number of
 * cycles in a row. The criteria are the paper's; the threshold values are the defaults of
 * the authors' reference implementation (bycycle's `detect_bursts_cycles`), as is the rule
 * that the first and last cycle are never in a burst.
 */
import type { CycleFeatures } from './cycle-features';

export interface BurstThresholds {
  /** A cycle's amplitude rank among the channel's cycles over their count must exceed this, 0…1. */
  amplitudeFraction: number;
  /** Ratio (smaller / larger) of rise and decay amplitudes, within and between neighbours, to exceed. */
  amplitudeConsistency: number;
  /** Ratio (shorter / longer) of a cycle's period to each neighbour's, to exceed. */
  periodConsistency: number;
  /** Share of monotonic steps in rise and decay, to exceed. */
  monotonicity: number;
  /** Fewest consecutive cycles passing every criterion that make a burst. */
  minCycles: number;
}

/** Gyre's thresholds: bycycle's defaults (see above). */
export const DEFAULT_BURST_THRESHOLDS: Readonly<BurstThresholds> = Object.freeze({
  amplitudeFraction: 0,
  amplitudeConsistency: 0.5,
  periodConsistency: 0.5,
  monotonicity: 0.8,
  minCycles: 3,
});

const ratio = (a: number, b: number): number => Math.min(a, b) / Math.max(a, b);

/** Each cycle's amplitude fraction: its mid-rank among the cycles' amplitudes over the count. */
function amplitudeFractions(amplitude: Float64Array): Float64Array {
  const n = amplitude.length;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => amplitude[a] - amplitude[b]);
  const fraction = new Float64Array(n);
  for (let first = 0; first < n;) {
    let last = first;
    while (last + 1 < n && amplitude[order[last + 1]] === amplitude[order[first]]) last++;
    // Ties share the mean of their 1-based ranks.
    const rank = (first + last) / 2 + 1;
    for (let k = first; k <= last; k++) fraction[order[k]] = rank / n;
    first = last + 1;
  }
  return fraction;
}

/**
 * True for each cycle in a burst. A cycle at either end of the recording has a missing
 * neighbour, so its consistencies are unknown and it is never in a burst.
 */
export function detectBursts(
  cycles: CycleFeatures,
  thresholds: Readonly<BurstThresholds> = DEFAULT_BURST_THRESHOLDS,
): Uint8Array {
  const n = cycles.count;
  const { riseAmplitude: rise, decayAmplitude: decay, periodS } = cycles;
  const amplitude = Float64Array.from(rise, (r, i) => (r + decay[i]) / 2);
  const fraction = amplitudeFractions(amplitude);
  const passes = new Uint8Array(n);
  for (let i = 1; i + 1 < n; i++) {
    // The end trough of cycle i−1 is the start trough of cycle i: its decay meets i's rise.
    const amplitudeConsistency = Math.min(
      ratio(rise[i], decay[i]),
      ratio(rise[i], decay[i - 1]),
      ratio(decay[i], rise[i + 1]),
    );
    const periodConsistency = Math.min(
      ratio(periodS[i], periodS[i - 1]),
      ratio(periodS[i], periodS[i + 1]),
    );
    passes[i] = Number(
      fraction[i] > thresholds.amplitudeFraction &&
        amplitudeConsistency > thresholds.amplitudeConsistency &&
        periodConsistency > thresholds.periodConsistency &&
        cycles.monotonicity[i] > thresholds.monotonicity,
    );
  }
  const burst = new Uint8Array(n);
  for (let first = 0; first < n;) {
    if (!passes[first]) {
      first++;
      continue;
    }
    let end = first;
    while (end < n && passes[end]) end++;
    if (end - first >= thresholds.minCycles) burst.fill(1, first, end);
    first = end;
  }
  return burst;
}
