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

/** 64 electrodes of the 10-10 system (ACNS 2016), as referential EDF labels. */
export const LABELS_64: readonly string[] = (
  'Fp1 Fpz Fp2 AF7 AF3 AFz AF4 AF8 F7 F5 F3 F1 Fz F2 F4 F6 F8 FT7 FC5 FC3 FC1 FCz FC2 FC4 ' +
  'FC6 FT8 T7 C5 C3 C1 Cz C2 C4 C6 T8 TP7 CP5 CP3 CP1 CPz CP2 CP4 CP6 TP8 P7 P5 P3 P1 Pz ' +
  'P2 P4 P6 P8 PO7 PO3 POz PO4 PO8 O1 Oz O2 Iz F9 F10'
)
  .split(' ')
  .map((name) => `EEG ${name}-REF`);

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
