/**
 * The recording `npm run bench` measures: a generated task recording (nothing here is
 * measured EEG) with 10-10 channel labels, a stimulus every 4 s annotated in the file, written
 * as EDF+ by the signal core's writer (Kemp & Olivan 2003). Run as its own process
 * (`node bench-recording.js FILE MINUTES CHANNELS RATE`) so that the hundreds of megabytes
 * it holds never count in the measuring process.
 */
import { writeFileSync } from 'node:fs';
import { syntheticEdf, syntheticTaskRecording } from '../signal/synthetic/synthetic-eeg';

/** 64 labels of the 10-10 system (ACNS 2016); the posterior region of interest is among them. */
export const LABELS_64: readonly string[] = (
  'Fp1 Fpz Fp2 AF7 AF3 AFz AF4 AF8 F7 F5 F3 F1 Fz F2 F4 F6 F8 FT7 FC5 FC3 FC1 FCz FC2 FC4 ' +
  'FC6 FT8 T7 C5 C3 C1 Cz C2 C4 C6 T8 TP7 CP5 CP3 CP1 CPz CP2 CP4 CP6 TP8 P7 P5 P3 P1 Pz ' +
  'P2 P4 P6 P8 PO7 PO3 POz PO4 PO8 O1 Oz O2 Iz F9 F10'
).split(' ');

/** Stimulus onsets every 4 s from 3 s to 3 s before the end, as the other generated tasks. */
export function benchOnsetsS(durationS: number): number[] {
  const onsets: number[] = [];
  for (let t = 3; t < durationS - 3; t += 4) onsets.push(t);
  return onsets;
}

export interface BenchRecordingSpec {
  minutes: number;
  channels: number;
  rateHz: number;
  /** Generator seed (default 42). */
  seed?: number;
}

/** The EDF+ bytes of the benchmark's task recording. */
export function benchRecordingBytes(spec: BenchRecordingSpec): Uint8Array {
  if (!(spec.channels >= 1 && spec.channels <= LABELS_64.length)) {
    throw new RangeError(`channels: 1 to ${LABELS_64.length} expected, got ${spec.channels}`);
  }
  const durationS = spec.minutes * 60;
  const recording = syntheticTaskRecording({
    sampleRateHz: spec.rateHz,
    durationS,
    channelLabels: LABELS_64.slice(0, spec.channels),
    onsetsS: benchOnsetsS(durationS),
    seed: spec.seed ?? 42,
  });
  return syntheticEdf(recording, { startDate: '2026-01-15T09:30:00' });
}

if (require.main === module) {
  const [path, minutes, channels, rate] = process.argv.slice(2);
  writeFileSync(
    path,
    benchRecordingBytes({
      minutes: Number(minutes),
      channels: Number(channels),
      rateHz: Number(rate),
    }),
  );
}
