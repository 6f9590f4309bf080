import { writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import type * as SignalCoreModule from '@gyre/backend/signal';

const require = createRequire(import.meta.url);

type SignalCore = typeof SignalCoreModule;

/**
 * The signal core through its public entry `@gyre/backend/signal` as built (CommonJS, hence
 * `require`): its EDF/EDF+ writer (Kemp et al. 1992; Kemp & Olivan 2003) and its generated
 * recordings, the same generator the backend's tests and the demo data use.
 */
export function signalCore(): SignalCore {
  return require('@gyre/backend/signal') as SignalCore;
}

const SAMPLE_RATE_HZ = 256;
const POSTERIOR_CHANNELS = ['O1', 'O2', 'Oz', 'Pz', 'P3', 'P4'];

/**
 * Generated test data (the signal core's `syntheticTaskRecording`): 20 µV alpha at `alphaHz`
 * on posterior 10-10 channels over 2 µV (SD) of seeded white noise, 256 Hz, as EDF+C. A task
 * recording has a "stimulus" annotation every `everyS` s from `firstOnsetS` and its alpha
 * changes by `deltaFHz` from +0.2 to +0.8 s after each (raised-cosine ramps of 0.2 s).
 */
export function writeAlphaRecording(options: {
  kind: 'resting' | 'task';
  alphaHz: number;
  /** Frequency change after each onset, Hz (negative: slowing); ignored at rest. */
  deltaFHz: number;
  durationS: number;
  startDate: string;
  channels?: readonly string[];
  firstOnsetS?: number;
  everyS?: number;
}): Uint8Array {
  const onsetsS: number[] = [];
  const first = options.firstOnsetS ?? 5;
  if (options.kind === 'task') {
    for (let t = first; t <= options.durationS - first; t += options.everyS ?? 4) onsetsS.push(t);
  }
  const core = signalCore();
  const recording = core.syntheticTaskRecording({
    sampleRateHz: SAMPLE_RATE_HZ,
    durationS: options.durationS,
    channelLabels: options.channels ?? POSTERIOR_CHANNELS,
    onsetsS,
    baseFrequencyHz: options.alphaHz,
    dipHz: options.deltaFHz,
    seed: options.kind === 'task' ? 7 : 11,
  });
  return core.syntheticEdf(recording, { startDate: options.startDate });
}

/**
 * Generated test data: an eyes-closed resting EDF+ recording, a 10 Hz alpha rhythm on
 * occipital and parietal 10-10 channels (`writeAlphaRecording`), `durationS` long.
 */
export function writeRestingEdf(
  dir: string,
  options: { durationS?: number; name?: string } = {},
): string {
  const file = join(dir, options.name ?? 'resting-v1.edf');
  const bytes = writeAlphaRecording({
    kind: 'resting',
    alphaHz: 10,
    deltaFHz: 0,
    durationS: options.durationS ?? 60,
    startDate: '2025-02-03T09:30:00',
  });
  writeFileSync(file, bytes);
  return file;
}

/**
 * Generated test data: a valid EDF+ file cut short by 1000 bytes, so its header promises more
 * data records than the file holds (EDF spec: header bytes + records × record size = file size).
 */
export function writeTruncatedEdf(dir: string): string {
  const whole = signalCore().writeEdf({
    format: 'EDF+C',
    startDate: '2025-02-03T09:40:00',
    signals: [
      {
        label: 'O1',
        sampleRateHz: 256,
        physicalMin: -500,
        physicalMax: 500,
        samples: new Float32Array(256 * 10),
      },
    ],
  });
  const file = join(dir, 'cut-short.edf');
  writeFileSync(file, whole.subarray(0, whole.length - 1000));
  return file;
}
