/**
 * Peak memory of one analysis run by the server's worker code on a 64-channel,
 * 60-minute, 500 Hz EDF+C task recording (~230 MB). Not a test: run by hand, one
 * process per step, because peak RSS is per process.
 *
 *   cd backend && npx tsc -p tsconfig.build.json --outDir /tmp/gyre-memory
 *   export NODE_PATH=$PWD/../node_modules   # fft.js, from outside the tree
 *   node /tmp/gyre-memory/signal/bench/measure-analysis-memory.js generate /tmp/big.edf
 *   node /tmp/gyre-memory/signal/bench/measure-analysis-memory.js whole-file /tmp/big.edf
 *   node /tmp/gyre-memory/signal/bench/measure-analysis-memory.js streamed /tmp/big.edf
 *   node /tmp/gyre-memory/signal/bench/measure-analysis-memory.js validate-whole-file /tmp/big.edf
 *   node /tmp/gyre-memory/signal/bench/measure-analysis-memory.js validate-streamed /tmp/big.edf
 *
 * `whole-file` is the worker's former path (readFile, SHA-256, readEdf of the bytes, then
 * the analysis); `streamed` is the path the worker runs now (`readRecordingForAnalysis`:
 * hash and decode chunk by chunk from disk, then `analyzeEdfRecording`). The `validate-…`
 * pair does the same for the upload check (`readEdf` of the bytes, or `readEdfFile`
 * streamed with no signal decoded, as the worker's validation reads). Both use Gyre's
 * default settings without an IAF. The recording is generated test data. The server now
 * runs the streamed path in parts, one per analysis thread (batches of channels per pass):
 * `jobs/bench/measure-analysis-parts.ts` measures that, on the file `generate` writes.
 */
import { createHash } from 'node:crypto';
import { createReadStream, readFileSync, writeFileSync } from 'node:fs';
import { performance } from 'node:perf_hooks';
import { readEdf } from '../edf/edf-reader';
import { DEFAULT_ANALYSIS_SETTINGS } from '../pipeline/analysis-settings';
import {
  AnalysisRunRequest,
  analyzeEdfRecording,
  readRecordingForAnalysis,
} from '../pipeline/analyze-edf-recording';
import { readEdfFile } from '../pipeline/read-edf-file';
import { syntheticEdf, syntheticTaskRecording } from '../synthetic/synthetic-eeg';
import { TEN_TEN_64 } from '../synthetic/ten-ten-64';

/** A task run with Gyre's default settings and no resting IAF (band 8–13 Hz). */
const REQUEST: AnalysisRunRequest = {
  kind: 'task',
  settings: DEFAULT_ANALYSIS_SETTINGS,
  iafHz: null,
  onsets: null,
};

function generate(path: string): void {
  const durationS = 60 * 60;
  const onsetsS: number[] = [];
  for (let t = 3; t < durationS - 3; t += 4) onsetsS.push(t);
  const recording = syntheticTaskRecording({
    sampleRateHz: 500,
    durationS,
    channelLabels: TEN_TEN_64,
    onsetsS,
    seed: 42,
  });
  const bytes = syntheticEdf(recording, { startDate: '2024-03-01T09:00:00' });
  writeFileSync(path, bytes);
  console.log(`wrote ${path}: ${(bytes.byteLength / 2 ** 20).toFixed(1)} MiB`);
}

async function main(): Promise<void> {
  const [mode, path] = process.argv.slice(2);
  if (mode === 'generate') return generate(path);
  // The checksum the run must find, hashed from a stream so it adds nothing to the peak.
  const hash = createHash('sha256');
  for await (const chunk of createReadStream(path)) hash.update(chunk as Buffer);
  const checksum = hash.digest('hex');
  const baseMb = process.memoryUsage().rss / 2 ** 20;
  const t0 = performance.now();
  let channels: number;
  if (mode === 'whole-file') {
    const bytes = readFileSync(path);
    const actual = createHash('sha256').update(bytes).digest('hex');
    if (actual !== checksum) throw new Error('checksum changed');
    const recording = readEdf(bytes);
    channels = analyzeEdfRecording(recording, REQUEST).outcome.summary.channels.length;
  } else if (mode === 'streamed') {
    const streamHash = createHash('sha256');
    const read = await readRecordingForAnalysis(path, {
      onChunk: (chunk) => streamHash.update(chunk),
    });
    if (streamHash.digest('hex') !== checksum) throw new Error('checksum changed');
    const outcome = analyzeEdfRecording(read.finish(), REQUEST).outcome;
    channels = outcome.summary.channels.length;
  } else if (mode === 'validate-whole-file') {
    channels = readEdf(readFileSync(path)).signals.length;
  } else if (mode === 'validate-streamed') {
    const read = await readEdfFile(path, { selectSignal: () => false });
    read.finish();
    channels = read.ordinarySignals?.length ?? 0;
  } else {
    throw new Error(
      `mode: expected generate, whole-file, streamed, validate-whole-file or validate-streamed, got '${mode}'`,
    );
  }
  const peakMb = process.resourceUsage().maxRSS / 1024;
  console.log(
    JSON.stringify({
      mode,
      channels,
      seconds: Number(((performance.now() - t0) / 1000).toFixed(1)),
      rssBeforeRunMb: Math.round(baseMb),
      peakRssMb: Math.round(peakMb),
    }),
  );
}

void main();
