/**
 * Recordings for the scale scenario, one resting and one task recording per visit, generated
 * by the signal core's synthetic generators and written as EDF+ (Kemp & Olivan 2003) by its
 * writer. `quick`: the crash test's short 4-channel files (a computation of well under a
 * second); otherwise `channels` × `minutes` at `rateHz`, the size the benchmark asks for.
 * Every file has its own seed, so each upload is a new stored file. Nothing here is measured
 * EEG; the patient field is left unknown.
 */
import { writeEdf } from '../../signal/edf';
import { restingUpload, taskUpload } from '../../robustness/crash/recording-files';
import type { GeneratedUpload } from '../../robustness/crash/recording-files';
import { Rng } from '../../robustness/seeded-random';
import {
  syntheticRestRecording,
  syntheticTaskRecording,
} from '../../signal/synthetic/synthetic-eeg';
import { TEN_TEN_64 } from '../../signal/synthetic/ten-ten-64';

export type ScaleSizes =
  { kind: 'quick' } | { kind: 'sized'; minutes: number; channels: number; rateHz: number };

export function describeSizes(sizes: ScaleSizes): string {
  return sizes.kind === 'quick'
    ? '4 channels at 256 Hz, resting 60 s and task 120 s'
    : `${sizes.channels} channels × ${sizes.minutes} min at ${sizes.rateHz} Hz`;
}

/** The visit's resting (index 0) or task (index 1) recording. */
export function scaleUpload(sizes: ScaleSizes, visit: number, index: 0 | 1): GeneratedUpload {
  const seed = 1000 + visit * 2 + index;
  if (sizes.kind === 'quick') {
    const rng = new Rng(seed);
    const quick = { restingS: [60], taskS: [120] };
    return index === 0 ? restingUpload(rng, quick, seed) : taskUpload(rng, quick, seed);
  }
  const durationS = sizes.minutes * 60;
  const channelLabels = TEN_TEN_64.slice(0, Math.min(sizes.channels, TEN_TEN_64.length));
  const signalsOf = (
    recording: ReturnType<typeof syntheticRestRecording>,
  ): Parameters<typeof writeEdf>[0]['signals'] =>
    recording.signals.map((s) => ({
      label: s.label,
      sampleRateHz: s.sampleRateHz,
      physicalMin: -500,
      physicalMax: 500,
      samples: s.samples,
    }));
  if (index === 0) {
    const recording = syntheticRestRecording({
      sampleRateHz: sizes.rateHz,
      durationS,
      channelLabels,
      peakHz: 8.5 + (visit % 20) / 10,
      seed,
    });
    return {
      kind: 'resting',
      bytes: writeEdf({ startDate: '2026-01-15T09:00:00', signals: signalsOf(recording) }),
      onsetsCsv: null,
      expect: 'accepted',
      description: `resting ${describeSizes(sizes)}`,
    };
  }
  const onsetsS: number[] = [];
  for (let t = 3; t <= durationS - 3; t += 4) onsetsS.push(t);
  const recording = syntheticTaskRecording({
    sampleRateHz: sizes.rateHz,
    durationS,
    channelLabels,
    onsetsS,
    dipHz: -0.6,
    seed,
  });
  return {
    kind: 'task',
    bytes: writeEdf({
      startDate: '2026-01-15T09:30:00',
      signals: signalsOf(recording),
      annotations: (recording.annotations ?? []).map((a) => ({ ...a })),
    }),
    onsetsCsv: null,
    expect: 'accepted',
    description: `task ${describeSizes(sizes)}`,
  };
}
