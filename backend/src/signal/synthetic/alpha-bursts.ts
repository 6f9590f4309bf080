/**
 * Alpha that comes and goes, and alpha that is not a sinusoid: the two cases the amplitude
 * gate and the cycle-by-cycle cross-check are built for (docs/method.md). Both keep the
 * carrier's phase, so the instantaneous frequency stays known in closed form
 * (alpha-rhythm.ts); only the amplitude or the shape of each cycle changes.
 */
import { seededUniform } from '../random/random';

/** Shape of one alpha cycle as a function of the carrier phase. */
export type AlphaWaveform = 'sine' | 'sawtooth';

/**
 * The carrier at phase φ. 'sawtooth': sin φ + ½ sin 2φ + ⅓ sin 3φ (the first three terms
 * of the Fourier series of a sawtooth), scaled to peak 1: a slow decay and a steep rise
 * with a sharp peak, whose fundamental still has the carrier's frequency.
 */
export function alphaWave(phaseRad: number, waveform: AlphaWaveform): number {
  if (waveform === 'sine') return Math.sin(phaseRad);
  return (
    (Math.sin(phaseRad) + Math.sin(2 * phaseRad) / 2 + Math.sin(3 * phaseRad) / 3) / SAWTOOTH_PEAK
  );
}

/** Largest value of sin φ + ½ sin 2φ + ⅓ sin 3φ (at φ = π/4: √2/2 + ½ + √2/6). */
const SAWTOOTH_PEAK = Math.SQRT2 / 2 + 0.5 + Math.SQRT2 / 6;

export interface AlphaBurstOptions {
  /** Mean length of a burst and of the pause between bursts, s. */
  meanBurstS: number;
  meanPauseS: number;
  /** Amplitude between bursts as a share of the burst amplitude (default 0.05). */
  floor?: number;
  /** Raised-cosine ramp at each end of a burst, s (default 0.1). */
  rampS?: number;
  seed?: number;
}

/**
 * Envelope of bursting alpha, one value per sample: bursts and pauses alternate, each
 * lasting 0.5…1.5 × its mean (uniform, seeded), with raised-cosine ramps, `floor` between
 * bursts and 1 inside them.
 */
export function alphaBurstEnvelope(
  sampleCount: number,
  sampleRateHz: number,
  options: AlphaBurstOptions,
): Float64Array {
  const floor = options.floor ?? 0.05;
  const rampS = options.rampS ?? 0.1;
  const random = seededUniform(options.seed ?? 3);
  const envelope = new Float64Array(sampleCount).fill(floor);
  let t = options.meanPauseS * (0.5 + random());
  const endS = sampleCount / sampleRateHz;
  while (t < endS) {
    const burstS = options.meanBurstS * (0.5 + random());
    const first = Math.max(0, Math.floor(t * sampleRateHz));
    const last = Math.min(sampleCount, Math.ceil((t + burstS) * sampleRateHz));
    for (let i = first; i < last; i++) {
      const u = i / sampleRateHz - t;
      const edge = Math.min(u, burstS - u);
      const rise =
        edge >= rampS ? 1 : edge <= 0 ? 0 : 0.5 * (1 - Math.cos((Math.PI * edge) / rampS));
      envelope[i] = floor + (1 - floor) * rise;
    }
    t += burstS + options.meanPauseS * (0.5 + random());
  }
  return envelope;
}
