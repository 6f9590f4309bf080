/**
 * For tests: a generated task recording (synthetic-eeg.ts: Δf = −0.6 Hz by construction)
 * written as an EDF+C file (Kemp & Olivan 2003), with its SHA-256.
 */
import { createHash } from 'node:crypto';
import { writeFileSync } from 'node:fs';
import { readEdfHeader } from '../../signal/edf';
import { syntheticEdf, syntheticTaskRecording } from '../../signal/synthetic/synthetic-eeg';

export interface GeneratedTaskEdf {
  path: string;
  checksumSha256: string;
}

export function writeGeneratedTaskEdf(
  path: string,
  options: {
    channelLabels: readonly string[];
    durationS: number;
    sampleRateHz?: number;
    seed?: number;
    /**
     * Labels of signals whose header says digital range −32768..32000, with their first
     * sample of each of the first three records set to 32767: outside the range, which the
     * reader must count (Kemp et al. 1992).
     */
    outOfRange?: readonly string[];
  },
): GeneratedTaskEdf {
  const onsetsS: number[] = [];
  for (let t = 3; t < options.durationS - 3; t += 4) onsetsS.push(t);
  const generated = syntheticTaskRecording({
    sampleRateHz: options.sampleRateHz ?? 250,
    durationS: options.durationS,
    channelLabels: options.channelLabels,
    onsetsS,
    seed: options.seed ?? 3,
  });
  const outOfRange = new Set(options.outOfRange ?? []);
  const bytes = syntheticEdf(generated, {
    startDate: '2024-05-06T09:00:00',
    signalHeader: (s) => (outOfRange.has(s.label) ? { digitalMax: 32000 } : {}),
  });
  if (outOfRange.size > 0) {
    // 16-bit little-endian samples, signal after signal within each record (Kemp et al. 1992).
    const info = readEdfHeader(bytes, bytes.byteLength);
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    let offset = 0;
    for (const signal of info.signalHeaders) {
      if (outOfRange.has(signal.label)) {
        for (let r = 0; r < 3; r++) {
          view.setInt16(info.header.headerBytes + r * info.recordBytes + offset, 32767, true);
        }
      }
      offset += 2 * signal.samplesPerRecord;
    }
  }
  writeFileSync(path, bytes);
  return { path, checksumSha256: createHash('sha256').update(bytes).digest('hex') };
}
