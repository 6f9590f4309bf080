/**
 * Synthetic EDF+ recordings for the demo study: an eyes-closed resting recording and a
 * stimulus task recording, with a known IAF and a known post-onset frequency change.
 * Deterministic: the same options (and seed key) give the same bytes. The pieces (frequency
 * track, pink noise, blinks, the seeded generator) are the signal core's own generators
 * (`@gyre/backend/signal`), shared with the backend's and the browser's tests.
 *
 * Each EEG channel is the sum of
 * - a 1/f background (`addPinkNoise`), partly shared by all channels;
 * - an alpha rhythm: amplitude envelope × sin(φ), φ integrating a known frequency track
 *   (`frequencyTrack`): IAF + the electrode's offset + a small shared wander
 *   + Δf · dipWeight(t − onset) after each stimulus;
 * - eye-blink-like deflections, scaled by the electrode's blink gain;
 * - 50 Hz line noise.
 */
import {
  addBlinks,
  addPinkNoise,
  BLINK_DURATION_S,
  fillSlowNoise,
  frequencyTrack,
  phaseFromFrequency,
  SeededRandom,
  writeEdf,
} from '@gyre/backend/signal';
import type { Blink, EdfAnnotation } from '@gyre/backend/signal';
import { DEMO_MONTAGE, edfLabel, MontageChannel } from './montage';
import { writeOnsetCsv } from './onset-csv-writer';

export const DEFAULT_SAMPLE_RATE_HZ = 250;
/** Annotation text of each stimulus onset, in the EDF+ file and the CSV. */
export const STIMULUS_LABEL = 'Stimulus';
/** Amplifier range written to the header; blinks stay well inside it. */
const PHYSICAL_RANGE_UV = 800;
/** Share of the background that is common to all channels (reference and volume conduction). */
const SHARED_BACKGROUND_SHARE = 0.3;
/** Epoch window of Gyre's default settings (docs/method.md §3): task blinks stay outside it. */
const EPOCH_WINDOW_S: readonly [number, number] = [-1, 2];

export interface RecordingOptions {
  /** Names the random streams: the same key gives the same file. */
  seedKey: string;
  /** Local start time, ISO `YYYY-MM-DDTHH:mm:ss`. */
  startDate: string;
  /** EDF+ patient field; default all unknown (`X X X X`). */
  patientId?: string;
  sampleRateHz?: number;
  /** The participant's alpha frequency at this visit, in Hz (the truth PAF). */
  iafHz: number;
  /** Alpha amplitude at O1/O2/Oz (sine peak), in µV; other electrodes by their gain. */
  alphaAmplitudeUv: number;
  /** RMS of the background at each channel, in µV. Default 6 µV. */
  backgroundRmsUv?: number;
  /** Peak of the 50 Hz line noise, in µV. Default 3 µV. */
  lineNoiseUv?: number;
  /** Standard deviation of the alpha frequency's slow wander, in Hz. Default 0.05 Hz. */
  frequencyWanderHz?: number;
  /**
   * Depth of the alpha's slow waxing and waning: the envelope is exp(depth·s(t)) for a
   * unit-variance slow noise s. Default 0.3; 0 gives a constant amplitude.
   */
  alphaEnvelopeDepth?: number;
  /** Mean blink rate, per minute; 0 for none. */
  blinksPerMinute?: number;
  montage?: readonly MontageChannel[];
}

export interface RestingRecordingOptions extends RecordingOptions {
  durationS: number;
}

export interface TaskRecordingOptions extends RecordingOptions {
  trialCount: number;
  /** Post-onset frequency change, Gyre's Δf in Hz (negative = slowing). */
  deltaFHz: number;
  /** Onset-to-onset interval, drawn uniformly from this range, in s. */
  interOnsetIntervalS?: readonly [number, number];
  /** Time before the first and after the last onset, in s. */
  marginS?: number;
  /** The onsets' labels (conditions), taken in turn; default: every onset `STIMULUS_LABEL`. */
  onsetLabels?: readonly string[];
}

export interface GeneratedRecording {
  kind: 'resting' | 'task';
  /** The complete EDF+ file. */
  edf: Uint8Array;
  durationS: number;
  sampleRateHz: number;
  channelLabels: string[];
  /** Stimulus onsets in s after the start (task only; empty at rest). */
  onsetsS: number[];
  /** `onset_s,label` CSV of the same onsets (task only). */
  onsetCsv: string | null;
  /** What an analysis should find: generated truth, not a measurement. */
  truth: { iafHz: number; deltaFHz: number | null };
}

interface SignalPlan {
  seedKey: string;
  durationS: number;
  sampleRateHz: number;
  onsetsS: number[];
  deltaFHz: number;
  blinks: Blink[];
}

/** An eyes-closed resting recording whose region-of-interest alpha peaks at `iafHz`. */
export function generateRestingRecording(options: RestingRecordingOptions): GeneratedRecording {
  const sampleRateHz = options.sampleRateHz ?? DEFAULT_SAMPLE_RATE_HZ;
  const durationS = Math.round(options.durationS);
  const rng = SeededRandom.derive(options.seedKey, 'rest-events');
  const blinks = drawBlinks(rng, {
    durationS,
    blinksPerMinute: options.blinksPerMinute ?? 4,
  });
  return synthesiseRecording(
    options,
    { durationS, sampleRateHz, onsetsS: [], deltaFHz: 0, blinks },
    {
      kind: 'resting',
      annotations: [{ onsetS: 0, durationS, text: 'Eyes closed' }],
      onsetCsv: null,
      truth: { iafHz: options.iafHz, deltaFHz: null },
    },
  );
}

/** A stimulus task recording: onsets in the EDF+ annotations (and as CSV), alpha changing by `deltaFHz` after each. */
export function generateTaskRecording(options: TaskRecordingOptions): GeneratedRecording {
  const sampleRateHz = options.sampleRateHz ?? DEFAULT_SAMPLE_RATE_HZ;
  const [minIntervalS, maxIntervalS] = options.interOnsetIntervalS ?? [3.6, 4.6];
  const marginS = options.marginS ?? 5;
  if (minIntervalS < EPOCH_WINDOW_S[1] - EPOCH_WINDOW_S[0]) {
    throw new RangeError(
      `interOnsetIntervalS: ${minIntervalS} s found, at least ${EPOCH_WINDOW_S[1] - EPOCH_WINDOW_S[0]} s expected so epochs do not overlap`,
    );
  }
  const rng = SeededRandom.derive(options.seedKey, 'task-events');
  const onsetsS: number[] = [];
  let t = marginS;
  for (let k = 0; k < options.trialCount; k++) {
    // Onsets on the sample grid, to the millisecond, so the CSV and the TALs say the same.
    onsetsS.push(Math.round(t * sampleRateHz) / sampleRateHz);
    t += rng.between(minIntervalS, maxIntervalS);
  }
  const durationS = Math.ceil(onsetsS[onsetsS.length - 1] + marginS);
  // Participants blink between trials, outside the epoch windows (common practice for task protocols).
  const blinks = drawBlinksBetweenTrials(rng, {
    onsetsS,
    blinksPerMinute: options.blinksPerMinute ?? 9,
  });
  const labels = options.onsetLabels ?? [STIMULUS_LABEL];
  const labelled = onsetsS.map((onsetS, k) => ({ onsetS, label: labels[k % labels.length] }));
  return synthesiseRecording(
    options,
    { durationS, sampleRateHz, onsetsS, deltaFHz: options.deltaFHz, blinks },
    {
      kind: 'task',
      annotations: labelled.map(({ onsetS, label }) => ({ onsetS, durationS: null, text: label })),
      onsetCsv: writeOnsetCsv(labelled),
      truth: { iafHz: options.iafHz, deltaFHz: options.deltaFHz },
    },
  );
}

/** The plan's channels synthesised and written with `annotations` as one EDF+ recording. */
function synthesiseRecording(
  options: RecordingOptions,
  plan: Omit<SignalPlan, 'seedKey'>,
  file: Pick<GeneratedRecording, 'kind' | 'onsetCsv' | 'truth'> & { annotations: EdfAnnotation[] },
): GeneratedRecording {
  const signals = synthesiseChannels(options, { seedKey: options.seedKey, ...plan });
  return {
    kind: file.kind,
    edf: encode(options, signals, file.annotations, plan.sampleRateHz),
    durationS: plan.durationS,
    sampleRateHz: plan.sampleRateHz,
    channelLabels: signals.map((s) => s.label),
    onsetsS: plan.onsetsS,
    onsetCsv: file.onsetCsv,
    truth: file.truth,
  };
}

function drawBlinks(
  rng: SeededRandom,
  options: { durationS: number; blinksPerMinute: number },
): Blink[] {
  const blinks: Blink[] = [];
  if (options.blinksPerMinute <= 0) return blinks;
  const meanGapS = 60 / options.blinksPerMinute;
  // Exponential gaps (a Poisson process; common practice) after a 0.5 s refractory time.
  let t = 1 - Math.log(1 - rng.uniform()) * meanGapS;
  while (t < options.durationS - 1 - BLINK_DURATION_S) {
    blinks.push({ startS: t, peakUv: rng.between(80, 150) });
    t += 0.5 - Math.log(1 - rng.uniform()) * meanGapS;
  }
  return blinks;
}

/** At most one blink in each gap between one epoch's end and the next one's start. */
function drawBlinksBetweenTrials(
  rng: SeededRandom,
  options: { onsetsS: readonly number[]; blinksPerMinute: number },
): Blink[] {
  const { onsetsS } = options;
  if (options.blinksPerMinute <= 0 || onsetsS.length < 2) return [];
  const meanIntervalS = (onsetsS[onsetsS.length - 1] - onsetsS[0]) / (onsetsS.length - 1);
  const chance = Math.min(1, (options.blinksPerMinute * meanIntervalS) / 60);
  const blinks: Blink[] = [];
  for (let k = 0; k + 1 < onsetsS.length; k++) {
    const earliestS = onsetsS[k] + EPOCH_WINDOW_S[1] + 0.05;
    const latestS = onsetsS[k + 1] + EPOCH_WINDOW_S[0] - BLINK_DURATION_S - 0.05;
    const draw = rng.uniform();
    const startS = rng.between(earliestS, latestS);
    const peakUv = rng.between(80, 150);
    if (latestS > earliestS && draw < chance) blinks.push({ startS, peakUv });
  }
  return blinks;
}

interface SynthesisedSignal {
  label: string;
  samples: Float64Array;
}

function synthesiseChannels(options: RecordingOptions, plan: SignalPlan): SynthesisedSignal[] {
  const { sampleRateHz, durationS } = plan;
  const montage = options.montage ?? DEMO_MONTAGE;
  const sampleCount = Math.round(durationS * sampleRateHz);
  const backgroundRmsUv = options.backgroundRmsUv ?? 6;
  const lineNoiseUv = options.lineNoiseUv ?? 3;
  const wanderSdHz = options.frequencyWanderHz ?? 0.05;

  // Shared pieces: the alpha envelope and frequency wander (alpha waxes and wanes over the
  // whole head together), the common background and the mains phase.
  const shared = SeededRandom.derive(plan.seedKey, 'shared');
  const envelopeNoise = new Float64Array(sampleCount);
  fillSlowNoise(envelopeNoise, shared, { sampleRateHz, timeConstantS: 0.6 });
  const wanderHz = new Float64Array(sampleCount);
  fillSlowNoise(wanderHz, shared, { sampleRateHz, timeConstantS: 0.4 });
  for (let n = 0; n < sampleCount; n++) wanderHz[n] *= wanderSdHz;
  const sharedBackground = new Float64Array(sampleCount);
  addPinkNoise(sharedBackground, shared, {
    sampleRateHz,
    rmsUv: backgroundRmsUv * Math.sqrt(SHARED_BACKGROUND_SHARE),
  });
  const mainsPhaseRad = shared.between(0, 2 * Math.PI);
  // A log-normal envelope stays positive, so the phase never flips (mean 1).
  const envelope = new Float64Array(sampleCount);
  const depth = options.alphaEnvelopeDepth ?? 0.3;
  for (let n = 0; n < sampleCount; n++) {
    envelope[n] = Math.exp(depth * envelopeNoise[n] - (depth * depth) / 2);
  }

  return montage.map((channel) => {
    const rng = SeededRandom.derive(plan.seedKey, `channel-${channel.electrode}`);
    const samples = new Float64Array(sampleCount);
    addPinkNoise(samples, rng, {
      sampleRateHz,
      rmsUv: backgroundRmsUv * Math.sqrt(1 - SHARED_BACKGROUND_SHARE) * rng.between(0.9, 1.1),
    });
    for (let n = 0; n < sampleCount; n++) samples[n] += sharedBackground[n];

    const track = frequencyTrack({
      sampleRateHz,
      sampleCount,
      baseHz: options.iafHz + channel.alphaOffsetHz,
      wanderHz,
      onsetsS: plan.onsetsS,
      deltaFHz: plan.deltaFHz,
    });
    const phase = phaseFromFrequency(track, {
      sampleRateHz,
      startPhaseRad: rng.between(0, 2 * Math.PI),
    });
    const amplitudeUv = options.alphaAmplitudeUv * channel.alphaGain * rng.between(0.9, 1.1);
    for (let n = 0; n < sampleCount; n++) {
      samples[n] += amplitudeUv * envelope[n] * Math.sin(phase[n]);
    }

    addBlinks(samples, plan.blinks, { sampleRateHz, gain: channel.blinkGain });

    const lineUv = lineNoiseUv * rng.between(0.5, 1.5);
    const linePhaseRad = mainsPhaseRad + rng.between(-0.2, 0.2);
    const lineStep = (2 * Math.PI * 50) / sampleRateHz;
    for (let n = 0; n < sampleCount; n++) {
      samples[n] += lineUv * Math.sin(lineStep * n + linePhaseRad);
    }
    return { label: edfLabel(channel.electrode), samples };
  });
}

function encode(
  options: RecordingOptions,
  signals: SynthesisedSignal[],
  annotations: EdfAnnotation[],
  sampleRateHz: number,
): Uint8Array {
  return writeEdf({
    format: 'EDF+C',
    patientId: options.patientId ?? 'X X X X',
    startDate: options.startDate,
    recordDurationS: 1,
    signals: signals.map((s) => ({
      label: s.label,
      sampleRateHz,
      physicalMin: -PHYSICAL_RANGE_UV,
      physicalMax: PHYSICAL_RANGE_UV,
      physicalDimension: 'uV',
      transducer: 'synthetic (Gyre demo generator)',
      samples: s.samples,
    })),
    annotations,
  });
}
