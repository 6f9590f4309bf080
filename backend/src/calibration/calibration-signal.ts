/**
 * The calibration recording: two generated EDF+C files with answers known by construction
 * (docs/method.md, "Calibration run"). A resting file whose alpha peak sits at exactly 10.0 Hz
 * and a task file whose alpha frequency falls by exactly 0.5 Hz from +0.2 to +0.8 s after each
 * onset. Both come from the signal core's generators with fixed seeds and are written by its
 * EDF writer, so every installation computes the same bytes.
 */
import { createHash } from 'node:crypto';
import type { AnalysisSettings } from '../signal/pipeline/analysis-settings';
import type { AnalysisRecording } from '../signal/pipeline/analysis.types';
import {
  syntheticEdf,
  syntheticRestRecording,
  syntheticTaskFrequencyHz,
  syntheticTaskRecording,
  type SyntheticTaskOptions,
} from '../signal/synthetic/synthetic-eeg';

/** Injection token of the calibration signal (tests may give another one). */
export const CALIBRATION_SIGNAL = Symbol('CALIBRATION_SIGNAL');

/** The tolerance of each compared value and where it comes from (docs/method.md). */
export interface CalibrationTolerances {
  /** Half the Welch bin spacing (4 s segments: 0.25 Hz bins), Hz. */
  pafHz: number;
  /** Baseline frequency, Hz: the same half bin. */
  baselineHz: number;
  /** Floor of the Δf tolerance, Hz; the run's own 95 % bootstrap half-width is added. */
  deltaFHz: number;
}

export interface CalibrationSignal {
  /** Shown with every run, so a reader knows which definition was compared with. */
  name: string;
  sampleRateHz: number;
  channelLabels: readonly string[];
  rest: { durationS: number; peakHz: number; seed: number };
  task: {
    durationS: number;
    firstOnsetS: number;
    onsetSpacingS: number;
    baseFrequencyHz: number;
    dipHz: number;
    dipWindowS: [number, number];
    rampS: number;
    seed: number;
  };
  tolerances: CalibrationTolerances;
}

/** Gyre's calibration signal, version 1 (docs/method.md, "Calibration run"). */
export const DEFAULT_CALIBRATION_SIGNAL: Readonly<CalibrationSignal> = Object.freeze({
  name: 'Gyre calibration signal 1',
  sampleRateHz: 250,
  // 10-10 names (ACNS Guideline 2, 2016); the posterior ones form the default ROI.
  channelLabels: ['Fz', 'Cz', 'Pz', 'P3', 'P4', 'POz', 'O1', 'Oz', 'O2'],
  rest: { durationS: 120, peakHz: 10, seed: 1701 },
  task: {
    durationS: 120,
    firstOnsetS: 2,
    onsetSpacingS: 4,
    baseFrequencyHz: 10,
    dipHz: -0.5,
    dipWindowS: [0.2, 0.8],
    rampS: 0.2,
    seed: 1702,
  },
  tolerances: { pafHz: 0.125, baselineHz: 0.125, deltaFHz: 0.05 },
} satisfies CalibrationSignal);

/** The task file's onsets, s from its start. */
export function calibrationOnsetsS(signal: CalibrationSignal): number[] {
  const { durationS, firstOnsetS, onsetSpacingS } = signal.task;
  const onsets: number[] = [];
  // The last epoch (−1…+2 s by default) must end inside the file.
  for (let t = firstOnsetS; t <= durationS - 4; t += onsetSpacingS) onsets.push(t);
  return onsets;
}

function taskOptions(signal: CalibrationSignal, onsetText: string): SyntheticTaskOptions {
  return {
    sampleRateHz: signal.sampleRateHz,
    durationS: signal.task.durationS,
    channelLabels: signal.channelLabels,
    onsetsS: calibrationOnsetsS(signal),
    baseFrequencyHz: signal.task.baseFrequencyHz,
    dipHz: signal.task.dipHz,
    dipWindowS: signal.task.dipWindowS,
    rampS: signal.task.rampS,
    seed: signal.task.seed,
    onsetText,
  };
}

/** The values a correct installation computes, from the signal's definition alone. */
export interface CalibrationTruth {
  pafHz: number;
  baselineHz: number;
  deltaFHz: number;
  trialsKept: number;
}

/**
 * Known answers for the given settings: the peak frequency, and the mean of the generated
 * frequency course over the baseline and post windows after an onset (integrated on a 1 ms
 * grid; with the default windows exactly 10.0 Hz and −0.5 Hz). Every onset is kept: the
 * signal's amplitude (≤ 22 µV) stays far inside any sensible rejection threshold.
 */
export function calibrationTruth(
  signal: CalibrationSignal,
  settings: Pick<AnalysisSettings, 'baselineWindowS' | 'postWindowS'>,
): CalibrationTruth {
  const onsets = calibrationOnsetsS(signal);
  const course = taskOptions(signal, 'stimulus');
  const meanOver = ([from, to]: [number, number]): number => {
    const steps = Math.max(1, Math.round((to - from) * 1000));
    let sum = 0;
    for (let k = 0; k < steps; k++) {
      const t = from + ((k + 0.5) * (to - from)) / steps;
      sum += syntheticTaskFrequencyHz(onsets[0] + t, course);
    }
    return sum / steps;
  };
  const baselineHz = meanOver(settings.baselineWindowS);
  return {
    pafHz: signal.rest.peakHz,
    baselineHz,
    deltaFHz: meanOver(settings.postWindowS) - baselineHz,
    trialsKept: onsets.length,
  };
}

export interface CalibrationFile {
  bytes: Uint8Array;
  checksumSha256: string;
}

function edfFile(recording: AnalysisRecording): CalibrationFile {
  const bytes = syntheticEdf(recording, { startDate: '2026-01-01T00:00:00' });
  return { bytes, checksumSha256: createHash('sha256').update(bytes).digest('hex') };
}

/** The resting file: a 10.0 Hz tone over a 1/f-like background (synthetic-eeg.ts). */
export function calibrationRestFile(signal: CalibrationSignal): CalibrationFile {
  return edfFile(
    syntheticRestRecording({
      sampleRateHz: signal.sampleRateHz,
      durationS: signal.rest.durationS,
      channelLabels: signal.channelLabels,
      peakHz: signal.rest.peakHz,
      seed: signal.rest.seed,
    }),
  );
}

/**
 * The task file, its onsets annotated with `onsetText` (the study's onset label, so that a
 * study choosing onsets by label still finds them).
 */
export function calibrationTaskFile(signal: CalibrationSignal, onsetText: string): CalibrationFile {
  return edfFile(syntheticTaskRecording(taskOptions(signal, onsetText)));
}
