/**
 * `npm run bench:workers [-- --workers 1,2 --visits 10 --minutes 10 --channels 64 --rate 500
 * --concurrency N]`: throughput of remote workers (a benchmark, not a test). For each worker
 * count it starts a fresh redis-server and server, uploads one resting and one task recording
 * per visit, then starts the workers and times them until every recording is ready, checking
 * that each was computed exactly once. `--quick --kill --json FILE` is the in-suite check
 * (backend/test/remote-workers-redis.e2e-spec.ts): small files, workers running from the
 * start, one of them SIGKILLed right after it takes a job.
 */
import 'reflect-metadata';
import { writeFileSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { parseArgs } from 'node:util';
import { runScaleScenario, ScaleReport } from './scale-scenario';

async function main(): Promise<void> {
  const { values } = parseArgs({
    options: {
      workers: { type: 'string', default: '1,2' },
      visits: { type: 'string', default: '10' },
      minutes: { type: 'string', default: '10' },
      channels: { type: 'string', default: '64' },
      rate: { type: 'string', default: '500' },
      concurrency: { type: 'string', default: String(availableParallelism()) },
      quick: { type: 'boolean', default: false },
      kill: { type: 'boolean', default: false },
      'keep-data': { type: 'boolean', default: false },
      json: { type: 'string' },
    },
  });
  const counts = values.workers.split(',').map((n) => positive(n, '--workers'));
  const reports: ScaleReport[] = [];
  for (const workers of counts) {
    const report = await runScaleScenario({
      visits: positive(values.visits, '--visits'),
      sizes: values.quick
        ? { kind: 'quick' }
        : {
            kind: 'sized',
            minutes: positive(values.minutes, '--minutes'),
            channels: positive(values.channels, '--channels'),
            rateHz: positive(values.rate, '--rate'),
          },
      workers,
      concurrency: positive(values.concurrency, '--concurrency'),
      workersAfterUploads: !values.quick,
      killOneWorker: values.kill,
      // Short in the quick check so the killed job returns within seconds; BullMQ's own
      // defaults (30 s) otherwise.
      lockMs: values.quick ? 3000 : 30_000,
      stalledIntervalMs: values.quick ? 1000 : 30_000,
      settleTimeoutMs: values.quick ? 150_000 : 3_600_000,
      keepData: values['keep-data'],
      log: (line) => process.stderr.write(`${line}\n`),
    });
    reports.push(report);
    process.stdout.write(`${formatReport(report)}\n`);
  }
  if (values.json !== undefined) writeFileSync(values.json, JSON.stringify(reports, null, 2));
  if (reports.some((r) => r.problems.length > 0)) process.exitCode = 1;
}

function formatReport(report: ScaleReport): string {
  const load = (values: number[]): string => values.map((v) => v.toFixed(2)).join(' ');
  return [
    `${report.workers} worker process(es) × ${report.concurrency} at once: ${report.recordings} recordings (${report.sizes})`,
    `  computed in ${report.computeS.toFixed(1)} s (${((report.recordings / report.computeS) * 60).toFixed(1)} recordings/min); uploads took ${report.uploadS.toFixed(1)} s`,
    `  jobs by worker: ${JSON.stringify(report.jobsByWorker)}`,
    `  load average before ${load(report.loadAverage.before)}, after ${load(report.loadAverage.after)}`,
    report.problems.length === 0
      ? '  every recording ready exactly once'
      : `  PROBLEMS (data kept in ${report.dataDir}):\n${report.problems.map((p) => `    - ${p}`).join('\n')}`,
  ].join('\n');
}

function positive(raw: string, name: string): number {
  const value = Number(raw);
  if (!Number.isInteger(value) || value < 1)
    throw new Error(`${name}: ${raw} is not a positive whole number`);
  return value;
}

main().catch((error: unknown) => {
  process.stderr.write(
    `${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`,
  );
  process.exit(1);
});
