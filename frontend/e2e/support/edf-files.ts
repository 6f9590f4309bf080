import { writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';

const require = createRequire(import.meta.url);

interface EdfWriteSignal {
  label: string;
  sampleRateHz: number;
  physicalMin: number;
  physicalMax: number;
  samples: Float32Array;
}
interface EdfWriter {
  writeEdf(spec: {
    format?: 'EDF' | 'EDF+C';
    startDate: string;
    signals: EdfWriteSignal[];
    annotations?: Array<{ onsetS: number; durationS: number | null; text: string }>;
  }): Uint8Array;
}

/**
 * The signal core's own EDF/EDF+ writer (Kemp et al. 1992; Kemp & Olivan 2003), through its
 * public entry `@gyre/backend/signal` as built (CommonJS, hence `require`).
 */
export function edfWriter(): EdfWriter {
  return require('@gyre/backend/signal') as EdfWriter;
}

/** A small deterministic generator, so every run writes the same bytes. */
export function seededNoise(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    // Numerical Recipes' LCG constants (from memory), scaled to −1..1.
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 31 - 1;
  };
}

/**
 * Generated test data: an eyes-closed resting EDF+ recording, a 10 Hz alpha tone of 20 µV on
 * occipital and parietal 10-10 channels over ±3 µV of noise, 256 Hz, `durationS` long.
 */
export function writeRestingEdf(
  dir: string,
  options: { durationS?: number; name?: string } = {},
): string {
  const sampleRateHz = 256;
  const durationS = options.durationS ?? 60;
  const n = sampleRateHz * durationS;
  const noise = seededNoise(42);
  const signals = ['O1', 'O2', 'Oz', 'Pz', 'P3', 'P4'].map((label, channel) => {
    const samples = new Float32Array(n);
    for (let i = 0; i < n; i++) {
      samples[i] = 20 * Math.sin((2 * Math.PI * 10 * i) / sampleRateHz + channel) + 3 * noise();
    }
    return { label, sampleRateHz, physicalMin: -500, physicalMax: 500, samples };
  });
  const bytes = edfWriter().writeEdf({
    format: 'EDF+C',
    startDate: '2025-02-03T09:30:00',
    signals,
  });
  const file = join(dir, options.name ?? 'resting-v1.edf');
  writeFileSync(file, bytes);
  return file;
}

/**
 * Generated test data: a valid EDF+ file cut short by 1000 bytes, so its header promises more
 * data records than the file holds (EDF spec: header bytes + records × record size = file size).
 */
export function writeTruncatedEdf(dir: string): string {
  const whole = edfWriter().writeEdf({
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
