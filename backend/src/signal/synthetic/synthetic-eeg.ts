import { writeEdf } from '../edf';
import type { EdfWriteSignal } from '../edf';
import { seededNormal } from '../random/random';
import type { AnalysisRecording, AnalysisSignal } from '../pipeline/analysis.types';
import { AlphaBurstOptions, alphaBurstEnvelope, alphaWave, AlphaWaveform } from './alpha-bursts';
import { dipWeight, phaseFromFrequency } from './alpha-rhythm';
import type { DipShape } from './alpha-rhythm';

/**
 * Generated recordings with known answers, for tests, the benchmark, the browser tests and
 * (through its pieces: alpha-rhythm.ts, background-noise.ts, eye-blinks.ts) the demo data.
 * Nothing here is measured EEG.
 */

// Standard normal values from the one seeded generator (Box–Muller): kept here for callers.
export { seededNormal };

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
  /** Shape of each alpha cycle (default 'sine'; alpha-bursts.ts). */
  waveform?: AlphaWaveform;
  /** Alpha in bursts with pauses between them (default: always on; alpha-bursts.ts). */
  bursts?: AlphaBurstOptions;
}

/**
 * The generated task the analysis-depth checks share (amplitude gate, cycle-by-cycle):
 * 3 channels at 250 Hz for 245 s, 60 onsets 4 s apart from 3 s, 10 Hz slowing to 9.5 Hz
 * from +0.2 to +0.8 s after each onset (Δf = −0.5 Hz by construction), 3 µV of noise.
 */
export const HALF_HERTZ_SLOWING_TASK: Readonly<SyntheticTaskOptions> = Object.freeze({
  sampleRateHz: 250,
  durationS: 245,
  channelLabels: ['O1', 'O2', 'Pz'],
  onsetsS: Array.from({ length: 60 }, (_, i) => 3 + 4 * i),
  dipHz: -0.5,
  noiseUv: 3,
  seed: 7,
});

/** The dip of `syntheticTaskRecording` as a raised-cosine `DipShape` (alpha-rhythm.ts). */
function taskDipShape(options: SyntheticTaskOptions): DipShape {
  const [w0, w1] = options.dipWindowS ?? [0.2, 0.8];
  const ramp = options.rampS ?? 0.2;
  return { riseStartS: w0 - ramp, plateauStartS: w0, plateauEndS: w1, fallEndS: w1 + ramp };
}

/** Frequency course of the synthetic task: base + dip·shape(t − nearest onset). */
export function syntheticTaskFrequencyHz(tS: number, options: SyntheticTaskOptions): number {
  const shape = taskDipShape(options);
  let weight = 0;
  for (const onset of options.onsetsS) weight = Math.max(weight, dipWeight(tS - onset, shape));
  return (options.baseFrequencyHz ?? 10) + (options.dipHz ?? -0.6) * weight;
}

/**
 * A task recording whose alpha frequency dips by `dipHz` from +0.2 to +0.8 s after
 * every onset (raised-cosine ramps of `rampS` outside that window), on every channel
 * with its own phase and amplitude, plus white noise. Annotated with the onsets.
 */
export function syntheticTaskRecording(options: SyntheticTaskOptions): AnalysisRecording {
  const fs = options.sampleRateHz;
  const n = Math.round(options.durationS * fs);
  const sorted = [...options.onsetsS].sort((a, b) => a - b);
  const course = { ...options, onsetsS: sorted };
  // Midpoint rule: the phase advance over one sample uses the frequency between samples.
  const track = new Float64Array(Math.max(0, n - 1));
  for (let i = 0; i < track.length; i++)
    track[i] = syntheticTaskFrequencyHz((i + 0.5) / fs, course);
  const phase = phaseFromFrequency(track, { sampleRateHz: fs, startPhaseRad: 0 });
  const normal = seededNormal(options.seed ?? 1);
  const amplitude = options.alphaAmplitudeUv ?? 20;
  const noise = options.noiseUv ?? 2;
  const waveform = options.waveform ?? 'sine';
  const envelope = options.bursts ? alphaBurstEnvelope(n, fs, options.bursts) : null;
  const signals = options.channelLabels.map((label, c) => {
    const samples = new Float32Array(n);
    const offset = 0.7 * c;
    const gain = amplitude * (1 - 0.05 * (c % 4));
    for (let i = 0; i < n; i++) {
      const alpha = gain * alphaWave(phase[i] + offset, waveform);
      samples[i] = (envelope ? alpha * envelope[i] : alpha) + noise * normal();
    }
    return generatedSignal(label, fs, samples);
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
    return generatedSignal(label, fs, samples);
  });
  return { signals, annotations: [], durationS: n / fs };
}

/** A generated channel in µV with the ±500 µV range every generated amplitude fits in. */
function generatedSignal(
  label: string,
  sampleRateHz: number,
  samples: Float32Array,
): AnalysisSignal {
  return {
    label,
    sampleRateHz,
    samples,
    physicalDimension: 'uV',
    physicalMin: -500,
    physicalMax: 500,
  };
}

export interface SyntheticEdfOptions {
  /** Local start time, ISO `YYYY-MM-DDTHH:mm:ss`. */
  startDate: string;
  /** EDF+ patient field; default all unknown (`X X X X`). */
  patientId?: string;
  /** Write the recording's annotations as EDF+ TALs (default true). */
  annotate?: boolean;
  /** Header fields of one signal other than the generated ±500 µV range. */
  signalHeader?: (signal: AnalysisSignal) => Partial<EdfWriteSignal>;
}

/** A generated recording written as an EDF+C file (Kemp & Olivan 2003). */
export function syntheticEdf(
  recording: AnalysisRecording,
  options: SyntheticEdfOptions,
): Uint8Array {
  return writeEdf({
    format: 'EDF+C',
    startDate: options.startDate,
    patientId: options.patientId ?? 'X X X X',
    signals: recording.signals.map((s) => ({
      label: s.label,
      sampleRateHz: s.sampleRateHz,
      physicalMin: s.physicalMin ?? -500,
      physicalMax: s.physicalMax ?? 500,
      physicalDimension: s.physicalDimension,
      samples: s.samples,
      ...options.signalHeader?.(s),
    })),
    annotations: options.annotate === false ? [] : recording.annotations,
  });
}
