/**
 * Eye-blink-like artefacts: a positive frontal deflection of a few hundred milliseconds,
 * largest at Fp1/Fp2 and fading towards the back of the head (common practice).
 */

export interface Blink {
  /** Start of the deflection, s after the recording start. */
  startS: number;
  /** Peak amplitude at Fp1, in µV. */
  peakUv: number;
}

/** Time from the start of a blink to its peak, in s; the whole blink lasts about 8 of these. */
export const BLINK_RISE_S = 0.09;
export const BLINK_DURATION_S = 8 * BLINK_RISE_S;

/**
 * Blink waveform at `timeAfterStartS`, peak 1 at BLINK_RISE_S:
 * g(u) = (u/τ)²·exp(2·(1 − u/τ)) for u ≥ 0 (a gamma-shaped pulse; common practice).
 */
export function blinkShape(timeAfterStartS: number): number {
  if (timeAfterStartS <= 0 || timeAfterStartS >= BLINK_DURATION_S) return 0;
  const u = timeAfterStartS / BLINK_RISE_S;
  return u * u * Math.exp(2 * (1 - u));
}

/** Adds `gain` × the blinks to `out` in place. */
export function addBlinks(
  out: Float64Array,
  blinks: readonly Blink[],
  options: { sampleRateHz: number; gain: number },
): void {
  const { sampleRateHz, gain } = options;
  if (gain === 0) return;
  for (const blink of blinks) {
    const first = Math.max(0, Math.floor(blink.startS * sampleRateHz));
    const last = Math.min(
      out.length - 1,
      Math.ceil((blink.startS + BLINK_DURATION_S) * sampleRateHz),
    );
    for (let n = first; n <= last; n++) {
      out[n] += gain * blink.peakUv * blinkShape(n / sampleRateHz - blink.startS);
    }
  }
}
