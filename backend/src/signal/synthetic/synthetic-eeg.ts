import { seededUniform } from '../onset/random';
import { AnalysisRecording } from '../pipeline/analysis.types';

/**
 * Generated recordings with known answers, for tests, the benchmark and demo data.
 * Nothing here is measured EEG.
 */

/** Standard normal values from a seeded uniform generator (Box–Muller, common practice). */
export function seededNormal(seed: number): () => number {
  const uniform = seededUniform(seed);
  let spare: number | null = null;
  return () => {
    if (spare !== null) {
      const v = spare;
      spare = null;
      return v;
    }
    const u = 1 - uniform();
    const v = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
}

export interface SyntheticTaskOptions {
  sampleRateHz: number;
  durationS: number;
  channelLabels: readonly string[];
  onsetsS: readonly number[];
  /** Alpha frequency outside the dips, Hz (default 10). */
  baseFrequencyHz?: number;
  /** Frequency change inside the dip window, Hz (default −0.6). */
  dipHz?: number;
  /** The dip holds fully in this window after each onset, s (default 0.2–0.8). */
  dipWindowS?: readonly [number, number];
  /** Raised-cosine ramp into and out of the dip, s (default 0.2). */
  rampS?: number;
  alphaAmplitudeUv?: number;
  /** Standard deviation of the white noise added to each channel, µV (default 2). */
  noiseUv?: number;
  seed?: number;
  /** Onset annotation text (default 'stimulus'). */
  onsetText?: string;
}

/** Frequency course of the synthetic task: base + dip·shape(t − nearest onset). */
export function syntheticTaskFrequencyHz(tS: number, options: SyntheticTaskOptions): number {
  const base = options.baseFrequencyHz ?? 10;
  const dip = options.dipHz ?? -0.6;
  const [w0, w1] = options.dipWindowS ?? [0.2, 0.8];
  const ramp = options.rampS ?? 0.2;
  let shape = 0;
  for (const onset of options.onsetsS) {
    const u = tS - onset;
    if (u <= w0 - ramp || u >= w1 + ramp) continue;
    if (u < w0) shape = Math.max(shape, 0.5 - 0.5 * Math.cos((Math.PI * (u - (w0 - ramp))) / ramp));
    else if (u <= w1) shape = 1;
    else shape = Math.max(shape, 0.5 + 0.5 * Math.cos((Math.PI * (u - w1)) / ramp));
  }
  return base + dip * shape;
}

/**
 * A task recording whose alpha frequency dips by `dipHz` from +0.2 to +0.8 s after
 * every onset (raised-cosine ramps of `rampS` outside that window), on every channel
 * with its own phase and amplitude, plus white noise. Annotated with the onsets.
 */
export function syntheticTaskRecording(options: SyntheticTaskOptions): AnalysisRecording {
  const fs = options.sampleRateHz;
  const n = Math.round(options.durationS * fs);
  const phase = new Float64Array(n);
  let acc = 0;
  const sorted = [...options.onsetsS].sort((a, b) => a - b);
  const course = { ...options, onsetsS: sorted };
  for (let i = 0; i < n; i++) {
    phase[i] = acc;
    // Midpoint rule: the phase advance over one sample uses the frequency between samples.
    acc += (2 * Math.PI * syntheticTaskFrequencyHz((i + 0.5) / fs, course)) / fs;
  }
  const normal = seededNormal(options.seed ?? 1);
  const amplitude = options.alphaAmplitudeUv ?? 20;
  const noise = options.noiseUv ?? 2;
  const signals = options.channelLabels.map((label, c) => {
    const samples = new Float32Array(n);
    const offset = 0.7 * c;
    const gain = amplitude * (1 - 0.05 * (c % 4));
    for (let i = 0; i < n; i++) samples[i] = gain * Math.sin(phase[i] + offset) + noise * normal();
    return {
      label,
      sampleRateHz: fs,
      samples,
      physicalDimension: 'uV',
      physicalMin: -500,
      physicalMax: 500,
    };
  });
  return {
    signals,
    annotations: sorted.map((onsetS) => ({
      onsetS,
      durationS: null,
      text: options.onsetText ?? 'stimulus',
    })),
    durationS: n / fs,
  };
}

export interface SyntheticRestOptions {
  sampleRateHz: number;
  durationS: number;
  channelLabels: readonly string[];
  /** Frequency of the alpha peak, Hz. */
  peakHz: number;
  alphaAmplitudeUv?: number;
  seed?: number;
}

/**
 * A resting recording: a tone at `peakHz` whose amplitude drifts slowly, over a 1/f-like
 * background (white noise through a leaky integrator) and white noise.
 */
export function syntheticRestRecording(options: SyntheticRestOptions): AnalysisRecording {
  const fs = options.sampleRateHz;
  const n = Math.round(options.durationS * fs);
  const normal = seededNormal(options.seed ?? 2);
  const amplitude = options.alphaAmplitudeUv ?? 15;
  const signals = options.channelLabels.map((label, c) => {
    const samples = new Float32Array(n);
    let walk = 0;
    for (let i = 0; i < n; i++) {
      const t = i / fs;
      walk = 0.99 * walk + 1.5 * normal();
      const envelope = 1 + 0.3 * Math.sin(2 * Math.PI * 0.05 * t + c);
      samples[i] =
        amplitude * envelope * Math.sin(2 * Math.PI * options.peakHz * t + c) + walk + 2 * normal();
    }
    return {
      label,
      sampleRateHz: fs,
      samples,
      physicalDimension: 'uV',
      physicalMin: -500,
      physicalMax: 500,
    };
  });
  return { signals, annotations: [], durationS: n / fs };
}
