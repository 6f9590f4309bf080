import { join } from 'node:path';
import { bitExact } from '../signal/pipeline/testing/bit-exact';
import { scratchFolder } from '../signal/testing/scratch-folder';
import { defaultAnalyzeTask } from './default-analyze-task';
import { writeGeneratedTaskEdf } from './testing/generated-task-edf';
import { WorkerPoolService } from './worker-pool.service';
import { PartReport, runAnalysis } from './worker/run-analysis';
import type { AnalyzeTask } from './worker/worker-tasks';

// Threads start from TypeScript under jest (ts-worker.cjs): slow on a busy machine.
const SLOW_MS = 180_000;

describe('WorkerPoolService.analyze: one recording on every analysis thread', () => {
  const { dir, remove } = scratchFolder('gyre-pool-');
  const pool = new WorkerPoolService(2);
  afterAll(async () => {
    await pool.onModuleDestroy();
    remove();
  });
  const taskFor = (name: string, seed: number): AnalyzeTask => {
    const file = writeGeneratedTaskEdf(join(dir, `${name}.edf`), {
      channelLabels: ['O1', 'O2', 'Oz', 'Pz', 'PO7', 'PO8'],
      durationS: 120,
      seed,
    });
    return defaultAnalyzeTask(file);
  };
  const task = taskFor('a', 1);

  it(
    'runs the two parts at once on two threads, with the numbers of one part',
    async () => {
      // The first run starts the threads; the second shows how parts run once they are up.
      const expected = bitExact(await runAnalysis(task, () => undefined));
      expect(bitExact(await pool.analyze(task, () => undefined))).toEqual(expected);
      const parts: PartReport[] = [];
      const progress: number[] = [];
      const outcome = await pool.analyze(task, (p) => progress.push(p), {
        onPart: (report) => parts.push(report),
      });
      expect(bitExact(outcome)).toEqual(expected);
      expect(
        parts.map((p) => p.batches).sort((a, b) => (a?.[0].from ?? 0) - (b?.[0].from ?? 0)),
      ).toEqual([[{ from: 0, to: 3 }], [{ from: 3, to: 6 }]]);
      const [a, b] = parts.map((p) => p.timing);
      expect(a.threadId).not.toBe(b.threadId);
      // Overlapping intervals: each part started before the other ended.
      expect(a.startedMs).toBeLessThan(b.endedMs);
      expect(b.startedMs).toBeLessThan(a.endedMs);
      expect(progress.every((p, i) => i === 0 || p > progress[i - 1])).toBe(true);
      expect(progress[progress.length - 1]).toBe(99);
    },
    SLOW_MS,
  );

  it(
    'finishes several recordings queued at once (parts queue, merges never wait for them)',
    async () => {
      const tasks = [task, taskFor('b', 2), taskFor('c', 3)];
      const expected = await Promise.all(tasks.map((t) => runAnalysis(t, () => undefined)));
      const outcomes = await Promise.all(tasks.map((t) => pool.analyze(t, () => undefined)));
      outcomes.forEach((outcome, i) => expect(bitExact(outcome)).toEqual(bitExact(expected[i])));
    },
    SLOW_MS,
  );

  it(
    'fails the run when the file does not hash to the run checksum',
    async () => {
      await expect(
        pool.analyze({ ...task, checksumSha256: '0'.repeat(64) }, () => undefined),
      ).rejects.toThrow(/SHA-256 [0-9a-f]{64} found, 0{64} expected/);
    },
    SLOW_MS,
  );
});
