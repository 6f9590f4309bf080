/**
 * Generated uploads for the crash test: resting and task recordings written by the signal
 * core's EDF+ writer (Kemp & Olivan 2003) from its synthetic generators, long enough that a
 * computation takes a good part of a second or more on this kind of machine (so a kill lands
 * in one), and a bad file. Every file differs (its own generator seed), so each upload is a
 * new stored file. Nothing here is measured EEG; the patient field is left unknown (`X X X X`).
 */
import {
  syntheticEdf,
  syntheticRestRecording,
  syntheticTaskRecording,
} from '../../signal/synthetic/synthetic-eeg';
import type { Rng } from '../seeded-random';

const CHANNELS = ['EEG O1-REF', 'EEG O2-REF', 'EEG Pz-REF', 'EEG Fz-REF'];

export interface GeneratedUpload {
  kind: 'resting' | 'task';
  bytes: Uint8Array;
  onsetsCsv: string | null;
  /** What the validation must say: accepted (then ready) or rejected. */
  expect: 'accepted' | 'rejected';
  description: string;
}

export interface UploadSizes {
  restingS: readonly number[];
  taskS: readonly number[];
}

/** The full run: computations of 0.2 to 2 s on 2 cores. */
export const FULL_SIZES: UploadSizes = { restingS: [120, 300, 600], taskS: [300, 600, 900] };
/** The in-suite run: shorter files, so the whole test stays within its time budget. */
export const QUICK_SIZES: UploadSizes = { restingS: [60, 120], taskS: [240, 420] };

function onsetsOf(durationS: number): number[] {
  const onsets: number[] = [];
  for (let t = 3; t <= durationS - 3; t += 4) onsets.push(t);
  return onsets;
}

export function restingUpload(rng: Rng, sizes: UploadSizes, seed: number): GeneratedUpload {
  const durationS = rng.pick(sizes.restingS);
  const peakHz = 8.5 + rng.int(0, 20) / 10;
  const recording = syntheticRestRecording({
    sampleRateHz: 256,
    durationS,
    channelLabels: CHANNELS,
    peakHz,
    seed,
  });
  return {
    kind: 'resting',
    bytes: syntheticEdf(recording, { startDate: '2026-01-15T09:00:00' }),
    onsetsCsv: null,
    expect: 'accepted',
    description: `resting ${durationS} s, peak ${peakHz} Hz`,
  };
}

export function taskUpload(rng: Rng, sizes: UploadSizes, seed: number): GeneratedUpload {
  const durationS = rng.pick(sizes.taskS);
  const onsetsS = onsetsOf(durationS);
  const recording = syntheticTaskRecording({
    sampleRateHz: 256,
    durationS,
    channelLabels: CHANNELS,
    onsetsS,
    dipHz: -0.6,
    seed,
  });
  // Onsets either as EDF+ annotations or as a CSV beside an unannotated file: both paths.
  const asCsv = rng.bool(0.3);
  return {
    kind: 'task',
    bytes: syntheticEdf(recording, { startDate: '2026-01-15T09:30:00', annotate: !asCsv }),
    onsetsCsv: asCsv ? `onset_s,label\n${onsetsS.map((t) => `${t},stimulus`).join('\n')}\n` : null,
    expect: 'accepted',
    description: `task ${durationS} s, onsets ${asCsv ? 'in a CSV' : 'annotated'}`,
  };
}

/** A valid resting file cut inside its last record: the reader must reject it (Kemp et al. 1992). */
export function badUpload(rng: Rng, sizes: UploadSizes, seed: number): GeneratedUpload {
  const valid = restingUpload(rng, { ...sizes, restingS: [sizes.restingS[0]] }, seed);
  const cut = valid.bytes.subarray(0, valid.bytes.length - rng.int(1, 1000));
  return {
    kind: 'resting',
    bytes: cut.slice(),
    onsetsCsv: null,
    expect: 'rejected',
    description: `resting file truncated to ${cut.length} bytes`,
  };
}
