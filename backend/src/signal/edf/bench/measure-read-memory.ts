/**
 * Peak memory of readEdf on a 64-channel, 60-minute, 500 Hz EDF+C file (~230 MB).
 * Not a test: run by hand, one process per step, because peak RSS is per process.
 *
 *   cd backend && npx tsc --outDir /tmp/gyre-edf-bench --rootDir src --target es2022 \
 *     --module node16 --moduleResolution node16 --strict --skipLibCheck --types node \
 *     src/signal/edf/bench/measure-read-memory.ts
 *   node /tmp/gyre-edf-bench/signal/edf/bench/measure-read-memory.js generate /tmp/big.edf
 *   node /tmp/gyre-edf-bench/signal/edf/bench/measure-read-memory.js read /tmp/big.edf
 *   node /tmp/gyre-edf-bench/signal/edf/bench/measure-read-memory.js read-roi /tmp/big.edf
 *   node /tmp/gyre-edf-bench/signal/edf/bench/measure-read-memory.js read-stream /tmp/big.edf
 *
 * The recording is generated test data (10 Hz sine plus noise), not a real recording.
 */
import { closeSync, openSync, readFileSync, readSync, statSync, writeFileSync } from 'node:fs';
import { roiChannelIndices } from '../../channels/region-of-interest';
import { readEdf } from '../edf-reader';
import { EdfStreamReader } from '../edf-stream-reader';
import type { EdfRecording } from '../edf.types';
import { writeEdf, type EdfWriteSignal } from '../edf-writer';
import { seededUniform } from '../../random/random';

const CHANNELS_64 = [
  'Fp1',
  'Fpz',
  'Fp2',
  'AF7',
  'AF3',
  'AFz',
  'AF4',
  'AF8',
  'F7',
  'F5',
  'F3',
  'F1',
  'Fz',
  'F2',
  'F4',
  'F6',
  'F8',
  'FT7',
  'FC5',
  'FC3',
  'FC1',
  'FCz',
  'FC2',
  'FC4',
  'FC6',
  'FT8',
  'T7',
  'C5',
  'C3',
  'C1',
  'Cz',
  'C2',
  'C4',
  'C6',
  'T8',
  'TP7',
  'CP5',
  'CP3',
  'CP1',
  'CPz',
  'CP2',
  'CP4',
  'CP6',
  'TP8',
  'P7',
  'P5',
  'P3',
  'P1',
  'Pz',
  'P2',
  'P4',
  'P6',
  'P8',
  'PO7',
  'PO3',
  'POz',
  'PO4',
  'PO8',
  'O1',
  'Oz',
  'O2',
  'Iz',
  'M1',
  'M2',
];
const SAMPLE_RATE_HZ = 500;
const DURATION_S = 3600;

const mb = (bytes: number): string => `${(bytes / 2 ** 20).toFixed(1)} MiB`;
const peakRssBytes = (): number => process.resourceUsage().maxRSS * 1024;

function generate(path: string): void {
  const n = SAMPLE_RATE_HZ * DURATION_S;
  const random = seededUniform(1);
  const signals: EdfWriteSignal[] = CHANNELS_64.map((name, c) => {
    const samples = new Float32Array(n);
    for (let i = 0; i < n; i++) {
      samples[i] =
        20 * Math.sin((2 * Math.PI * 10 * i) / SAMPLE_RATE_HZ + c) + (random() - 0.5) * 10;
    }
    return {
      label: `EEG ${name}-REF`,
      sampleRateHz: SAMPLE_RATE_HZ,
      physicalMin: -500,
      physicalMax: 500,
      samples,
    };
  });
  const bytes = writeEdf({
    startDate: '2024-01-01T09:00:00',
    signals,
    annotations: [{ onsetS: 60, durationS: null, text: 'generated marker' }],
  });
  writeFileSync(path, bytes);
  console.log(`wrote ${path}: ${mb(bytes.byteLength)}`);
}

/** Reads the file in 1 MiB pieces into one reused buffer: the file is never whole in memory. */
function readStreamed(path: string, fileBytes: number): EdfRecording {
  const reader = new EdfStreamReader(fileBytes);
  const chunk = new Uint8Array(1 << 20);
  const fd = openSync(path, 'r');
  try {
    for (;;) {
      const n = readSync(fd, chunk, 0, chunk.length, null);
      if (n === 0) break;
      reader.push(chunk.subarray(0, n));
    }
  } finally {
    closeSync(fd);
  }
  return reader.finish();
}

function read(path: string, mode: string): void {
  const roiOnly = mode === 'read-roi';
  const fileBytes = statSync(path).size;
  const before = peakRssBytes();
  const t0 = process.hrtime.bigint();
  const roi = new Set(roiChannelIndices(CHANNELS_64.map((c) => `EEG ${c}-REF`)));
  const options = roiOnly ? { selectSignal: (_s: unknown, i: number) => roi.has(i) } : {};
  const rec =
    mode === 'read-stream' ? readStreamed(path, fileBytes) : readEdf(readFileSync(path), options); // a Buffer is a Uint8Array: no copy
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  const outputBytes = rec.signals.reduce((sum, s) => sum + s.samples.byteLength, 0);
  const peak = peakRssBytes();
  console.log(
    [
      `file ${mb(fileBytes)}, ${rec.signals.length} signals decoded, output ${mb(outputBytes)}`,
      `read in ${ms.toFixed(0)} ms (${mode})`,
      `peak RSS ${mb(peak)} (${(peak / fileBytes).toFixed(2)} × file size; node before reading ${mb(before)})`,
      `peak RSS − output = ${mb(peak - outputBytes)} (file bytes held, if any, + reader overhead + node)`,
      `annotations: ${rec.annotations.map((a) => a.text).join(', ')}`,
    ].join('\n'),
  );
}

const [mode, path] = process.argv.slice(2);
if (mode === 'generate' && path) generate(path);
else if (['read', 'read-roi', 'read-stream'].includes(mode) && path) read(path, mode);
else console.error('usage: measure-read-memory (generate|read|read-roi|read-stream) <file.edf>');
