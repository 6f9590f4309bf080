/**
 * The alpha rhythm of one synthetic recording: a carrier whose instantaneous frequency is
 * known in closed form at every sample, so the truth an analysis should recover is exact.
 *
 * Instantaneous frequency is the phase derivative over 2π (Boashash 1992): the generator
 * sets f between samples n and n+1 and accumulates phase φ[n+1] = φ[n] + 2π·f[n+½]/fs, so
 * (φ[n+1] − φ[n])·fs/(2π) — the estimator of docs/method.md §2 — gives f back exactly.
 */

/** Shape of the post-onset frequency change: raised-cosine ramps around a flat plateau. */
export interface DipShape {
  /** The change starts at this time after onset, in s. */
  riseStartS: number;
  /** Full change from here… */
  plateauStartS: number;
  /** …to here, in s after onset. */
  plateauEndS: number;
  /** Back to no change here, in s after onset. */
  fallEndS: number;
}

/**
 * The full change over Gyre's post window (+0.2 to +0.8 s, docs/method.md §3) and none in its
 * baseline window (−0.5 to 0 s), so the generated Δf (post − baseline) is exactly Δf.
 */
export const DEFAULT_DIP_SHAPE: Readonly<DipShape> = Object.freeze({
  riseStartS: 0,
  plateauStartS: 0.2,
  plateauEndS: 0.8,
  fallEndS: 1.2,
});

/** 0…1: how much of the change applies `timeAfterOnsetS` after an onset (C¹-smooth). */
export function dipWeight(timeAfterOnsetS: number, shape: DipShape = DEFAULT_DIP_SHAPE): number {
  const t = timeAfterOnsetS;
  if (t <= shape.riseStartS || t >= shape.fallEndS) return 0;
  if (t < shape.plateauStartS) {
    const u = (t - shape.riseStartS) / (shape.plateauStartS - shape.riseStartS);
    return 0.5 * (1 - Math.cos(Math.PI * u));
  }
  if (t <= shape.plateauEndS) return 1;
  const u = (t - shape.plateauEndS) / (shape.fallEndS - shape.plateauEndS);
  return 0.5 * (1 + Math.cos(Math.PI * u));
}

export interface FrequencyTrackOptions {
  sampleRateHz: number;
  /** Number of samples of the recording; the track has one value fewer (between samples). */
  sampleCount: number;
  /** Frequency without wander or slowing, in Hz. */
  baseHz: number;
  /** Optional zero-mean wander in Hz, one value per sample (read at sample n for the step n→n+1). */
  wanderHz?: Float64Array;
  /** Stimulus onsets, s after the start. */
  onsetsS?: readonly number[];
  /** Change of frequency after onset in Hz, Gyre's Δf (negative = slowing). */
  deltaFHz?: number;
  dipShape?: DipShape;
}

/**
 * Instantaneous frequency between samples n and n+1 (at time (n + ½)/fs), in Hz:
 * base + wander + Δf · Σ dipWeight(t − onset).
 */
export function frequencyTrack(options: FrequencyTrackOptions): Float64Array {
  const { sampleRateHz, sampleCount, baseHz } = options;
  const track = new Float64Array(Math.max(0, sampleCount - 1));
  track.fill(baseHz);
  if (options.wanderHz) {
    for (let n = 0; n < track.length; n++) track[n] += options.wanderHz[n];
  }
  const deltaFHz = options.deltaFHz ?? 0;
  const shape = options.dipShape ?? DEFAULT_DIP_SHAPE;
  if (deltaFHz !== 0) {
    for (const onsetS of options.onsetsS ?? []) {
      const first = Math.max(0, Math.floor((onsetS + shape.riseStartS) * sampleRateHz) - 1);
      const last = Math.min(track.length - 1, Math.ceil((onsetS + shape.fallEndS) * sampleRateHz));
      for (let n = first; n <= last; n++) {
        track[n] += deltaFHz * dipWeight((n + 0.5) / sampleRateHz - onsetS, shape);
      }
    }
  }
  return track;
}

/**
 * Phase in radians at each sample from a frequency track (see `frequencyTrack`):
 * φ[0] = startPhaseRad, φ[n+1] = φ[n] + 2π·f[n+½]/fs.
 */
export function phaseFromFrequency(
  track: Float64Array,
  options: { sampleRateHz: number; startPhaseRad: number },
): Float64Array {
  const phase = new Float64Array(track.length + 1);
  phase[0] = options.startPhaseRad;
  const step = (2 * Math.PI) / options.sampleRateHz;
  for (let n = 0; n < track.length; n++) phase[n + 1] = phase[n] + step * track[n];
  return phase;
}
