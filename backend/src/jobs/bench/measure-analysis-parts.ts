/**
 * Wall time, CPU time and peak memory of one analysis through the server's worker pool
 * (`WorkerPoolService.analyze`: parts on the analysis threads, then the merge), with one
 * analysis thread (one part) or more. Not a test: run by hand, one process per figure,
 * because peak RSS and CPU time are per process (all threads included).
 *
 *   cd backend && npx tsc -p tsconfig.build.json --outDir /tmp/gyre-parts
 *   export NODE_PATH=$PWD/../node_modules
 *   node /tmp/gyre-parts/signal/bench/measure-analysis-memory.js generate /tmp/big.edf
 *   node /tmp/gyre-parts/jobs/bench/measure-analysis-parts.js /tmp/big.edf --threads 1
 *   node /tmp/gyre-parts/jobs/bench/measure-analysis-parts.js /tmp/big.edf --threads 2
 *
 * `generate` writes the generated 64-channel, 60-minute, 500 Hz task recording (EDF+C,
 * ~220 MiB). The run uses Gyre's default settings without an IAF; the file is hashed first
 * from a stream, outside the figures, to give the run its checksum. Prints one JSON line
 * with the load average before and after (the machine may be shared).
 */
import { loadavg } from 'node:os';
import { performance } from 'node:perf_hooks';
import { defaultAnalyzeTaskOfFile } from '../default-analyze-task';
import { WorkerPoolService } from '../worker-pool.service';
import type { PartReport } from '../worker/run-analysis';

async function main(): Promise<void> {
  const [path, flag, value] = process.argv.slice(2);
  const threads = flag === '--threads' ? Number(value) : NaN;
  if (!path || !(Number.isInteger(threads) && threads >= 1)) {
    throw new Error('usage: measure-analysis-parts.js FILE.edf --threads N (N ≥ 1)');
  }
  const task = await defaultAnalyzeTaskOfFile(path);
  const pool = new WorkerPoolService(threads);
  const load = (): number[] => loadavg().map((v) => Number(v.toFixed(2)));
  const loadBefore = load();
  const rssBeforeMb = process.memoryUsage().rss / 2 ** 20;
  const cpu0 = process.cpuUsage();
  const t0 = performance.now();
  const parts: PartReport[] = [];
  const outcome = await pool.analyze(task, () => undefined, {
    onPart: (report) => parts.push(report),
  });
  const wallS = (performance.now() - t0) / 1000;
  const cpu = process.cpuUsage(cpu0);
  const loadAfter = load();
  await pool.onModuleDestroy();
  console.log(
    JSON.stringify({
      threads,
      channels: outcome.summary.channels.length,
      deltaFHz: outcome.summary.roi?.deltaFHz,
      wallS: Number(wallS.toFixed(1)),
      cpuS: Number(((cpu.user + cpu.system) / 1e6).toFixed(1)),
      parts: parts
        .sort((a, b) => a.part - b.part)
        .map((p) => ({
          batches: p.batches?.length ?? 1,
          seconds: Number(((p.timing.endedMs - p.timing.startedMs) / 1000).toFixed(1)),
          startedAtS: Number(
            ((p.timing.startedMs - performance.timeOrigin - t0) / 1000).toFixed(1),
          ),
        })),
      rssBeforeRunMb: Math.round(rssBeforeMb),
      peakRssMb: Math.round(process.resourceUsage().maxRSS / 1024),
      loadBefore,
      loadAfter,
    }),
  );
}

main().catch((error: unknown) => {
  console.error(error);
  process.exitCode = 1;
});
