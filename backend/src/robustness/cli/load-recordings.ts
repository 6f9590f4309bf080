/**
 * The recordings `npm run load` reads back: a 64-channel montage (the size a results answer
 * must stay light at), written by the signal core's EDF+ writer (Kemp & Olivan 2003) from its
 * synthetic generators. Nothing here is measured EEG; the patient field is left unknown.
 */
import {
  syntheticEdf,
  syntheticRestRecording,
  syntheticTaskRecording,
} from '../../signal/synthetic/synthetic-eeg';
import { TEN_TEN_64 } from '../../signal/synthetic/ten-ten-64';

/** The 64 electrodes of `TEN_TEN_64` as referential EDF labels. */
export const LABELS_64: readonly string[] = TEN_TEN_64.map((name) => `EEG ${name}-REF`);

const SAMPLE_RATE_HZ = 256;

/** One stimulus every 4 s from 3 s to the end − 3 s. */
export function loadOnsets(durationS: number): number[] {
  const onsets: number[] = [];
  for (let t = 3; t <= durationS - 3; t += 4) onsets.push(t);
  return onsets;
}

/** A 64-channel EDF+C task recording, onsets annotated, alpha dipping by `dipHz` after each. */
export function task64Edf(options: {
  durationS: number;
  seed: number;
  baseFrequencyHz?: number;
  dipHz?: number;
}): Uint8Array {
  const recording = syntheticTaskRecording({
    sampleRateHz: SAMPLE_RATE_HZ,
    durationS: options.durationS,
    channelLabels: LABELS_64,
    onsetsS: loadOnsets(options.durationS),
    baseFrequencyHz: options.baseFrequencyHz,
    dipHz: options.dipHz ?? -0.5,
    seed: options.seed,
  });
  return syntheticEdf(recording, { startDate: '2026-01-15T09:30:00' });
}

/** A 64-channel EDF+C resting recording with its alpha peak at `peakHz`. */
export function rest64Edf(options: {
  durationS: number;
  seed: number;
  peakHz: number;
}): Uint8Array {
  const recording = syntheticRestRecording({
    sampleRateHz: SAMPLE_RATE_HZ,
    durationS: options.durationS,
    channelLabels: LABELS_64,
    peakHz: options.peakHz,
    seed: options.seed,
  });
  return syntheticEdf(recording, { startDate: '2026-01-15T09:00:00' });
}
