/**
 * Remote workers for real: the built CLI (dist/remote-workers/scale/scale-cli.js) starts a
 * redis-server on a free port, the built server with REDIS_URL, and two `npm run worker`
 * processes (dist/remote-workers/worker-cli.js), uploads twenty small recordings (a resting and
 * a task recording for each of ten visits), SIGKILLs one worker right after it takes a job and
 * starts it again; this test reads its JSON report. It runs in a process of its own, like the
 * crash test, because jest's module sandbox makes generating recordings much slower. The
 * throughput figures of `npm run bench:workers` are in docs/scale-out.md.
 */
import { existsSync, rmSync } from 'node:fs';
import { builtCliReport } from './helpers/built-dist';
import { REDIS_SERVER } from '../src/remote-workers/redis-server-process';
import type { ScaleReport } from '../src/remote-workers/scale/scale-scenario';

describe('twenty recordings computed by two worker processes, one of them killed mid-job', () => {
  let report: ScaleReport;

  beforeAll(() => {
    // No redis-server, no test: say so plainly rather than skip (`.ci/run` installs it).
    if (!existsSync(REDIS_SERVER)) {
      throw new Error(`${REDIS_SERVER} is missing: apt-get install redis-server (as .ci/run does)`);
    }
    report = builtCliReport<ScaleReport[]>(
      'backend/dist/remote-workers/scale/scale-cli.js',
      ['--quick', '--kill', '--workers', '2', '--visits', '10', '--concurrency', '1'],
      200_000,
      'the scale check',
    )[0];
  }, 230_000);

  it('computes all twenty exactly once: one run, one "compute" and one "ready" entry, one attempt each', () => {
    // On failure the problems name each recording, and the data folder is kept.
    expect(report.problems.length === 0 ? 'none' : report.problems.join('\n')).toBe('none');
    expect(report.recordings).toBe(20);
    expect(report.states).toEqual({ ready: 20 });
  });

  it('lets another worker finish the job of the killed one, through BullMQ’s stalled-job recovery', () => {
    expect(report.kill).not.toBeNull();
    const kill = report.kill as NonNullable<ScaleReport['kill']>;
    expect(kill.takenAgainBy.length).toBeGreaterThanOrEqual(1);
    expect(kill.finishedBy).toHaveLength(1);
    expect(kill.finishedBy[0]).not.toBe(kill.worker);
    // Both live workers did some of the work.
    const busy = Object.entries(report.jobsByWorker).filter(
      ([name, jobs]) => !name.includes('killed') && jobs.finished > 0,
    );
    expect(busy.length).toBeGreaterThanOrEqual(2);
  });

  it('gives the worker token nothing but the worker API, and users nothing of it', () => {
    for (const [request, status] of Object.entries(report.access)) {
      expect([request, status]).toEqual([request, 403]);
    }
    expect(Object.keys(report.access)).toHaveLength(6);
  });

  afterAll(() => {
    if (report?.problems.length === 0) rmSync(report.dataDir, { recursive: true, force: true });
  });
});
