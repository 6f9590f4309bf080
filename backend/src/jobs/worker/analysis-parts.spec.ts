import { join } from 'node:path';
import {
  analyzeEdfRecording,
  readRecordingForAnalysis,
} from '../../signal/pipeline/analyze-edf-recording';
import { bitExact } from '../../signal/pipeline/testing/bit-exact';
import { scratchFolder } from '../../signal/testing/scratch-folder';
import { defaultAnalyzeTask } from '../default-analyze-task';
import { writeGeneratedTaskEdf } from '../testing/generated-task-edf';
import { layoutParts } from './analysis-parts';
import { runAnalysis } from './run-analysis';

const MIB = 2 ** 20;

describe('layoutParts', () => {
  it('cuts 64 equal channels into two halves and batches within the budget', () => {
    // 60 min at 500 Hz: 1.8 M samples, 7.2 MB of Float32 per channel; 64 MiB holds 9.
    const parts = layoutParts(new Array<number>(64).fill(1_800_000), 2, 64 * MIB);
    expect(parts).toEqual([
      [
        { from: 0, to: 9 },
        { from: 9, to: 18 },
        { from: 18, to: 27 },
        { from: 27, to: 32 },
      ],
      [
        { from: 32, to: 41 },
        { from: 41, to: 50 },
        { from: 50, to: 59 },
        { from: 59, to: 64 },
      ],
    ]);
  });

  it('balances samples, not channels, and gives every part a channel', () => {
    // One channel holds half the samples: it is a part of its own.
    expect(layoutParts([4, 1, 1, 1, 1], 2, Infinity)).toEqual([
      [{ from: 0, to: 1 }],
      [{ from: 1, to: 5 }],
    ]);
    // 5 equal channels in 3 parts: boundaries nearest 5/3 and 10/3 channels.
    expect(layoutParts([1, 1, 1, 1, 1], 3, Infinity)).toEqual([
      [{ from: 0, to: 2 }],
      [{ from: 2, to: 3 }],
      [{ from: 3, to: 5 }],
    ]);
    // More threads than channels: one part per channel.
    expect(layoutParts([7, 7], 8, Infinity)).toEqual([[{ from: 0, to: 1 }], [{ from: 1, to: 2 }]]);
  });

  it('puts a channel larger than the budget in a batch of its own, and keeps one empty part', () => {
    expect(layoutParts([10, 10, 10], 1, 4)).toEqual([
      [
        { from: 0, to: 1 },
        { from: 1, to: 2 },
        { from: 2, to: 3 },
      ],
    ]);
    expect(layoutParts([], 2)).toEqual([[{ from: 0, to: 0 }]]);
  });
});

describe('runAnalysis in parts', () => {
  const { dir, remove } = scratchFolder('gyre-parts-');
  afterAll(remove);
  // Oz (analysed, in the last part) and ECG (never decoded) hold samples outside their
  // digital range: the lead part alone must still report both, as reading every signal does.
  const file = writeGeneratedTaskEdf(join(dir, 'task.edf'), {
    channelLabels: ['O1', 'O2', 'ECG', 'Pz', 'Cz', 'Oz'],
    durationS: 50,
    outOfRange: ['Oz', 'ECG'],
  });
  const task = defaultAnalyzeTask(file);

  /** The command line's path: one read of every analysed channel, one analysis. */
  async function wholeFile(): Promise<unknown> {
    const read = await readRecordingForAnalysis(file.path);
    const request = { kind: 'task' as const, settings: task.settings, iafHz: null, onsets: null };
    return analyzeEdfRecording(read.finish(), request).outcome;
  }

  it.each([
    [1, 'one batch', undefined],
    [2, 'one batch', undefined],
    [3, 'one batch', undefined],
    [2, 'one channel', 1],
    [3, 'one channel', 1],
  ])(
    'gives the numbers of one whole read to the bit (%i part(s), %s per pass)',
    async (parts, _batch, batchBytes) => {
      const progress: number[] = [];
      const outcome = await runAnalysis(task, (p) => progress.push(p), { parts, batchBytes });
      expect(bitExact(outcome)).toEqual(bitExact(await wholeFile()));
      // 3 samples out of range per signal, written so (generated-task-edf.ts).
      expect(outcome.summary.quality.warnings).toEqual(
        expect.arrayContaining([
          "Signal 'ECG': 3 samples outside its digital range -32768..32000.",
          "Signal 'Oz': 3 samples outside its digital range -32768..32000.",
        ]),
      );
      // Δf = −0.6 Hz by construction (synthetic-eeg.ts).
      expect(Math.abs((outcome.summary.roi?.deltaFHz as number) + 0.6)).toBeLessThan(0.05);
      expect(progress.every((p, i) => i === 0 || p > progress[i - 1])).toBe(true);
      expect(progress[progress.length - 1]).toBe(99);
    },
  );

  it('fails on a wrong checksum before using what was read, whatever the parts', async () => {
    await expect(
      runAnalysis({ ...task, checksumSha256: 'f'.repeat(64) }, () => undefined, { parts: 3 }),
    ).rejects.toThrow(/SHA-256 [0-9a-f]{64} found, f{64} expected/);
  });
});
