/**
 * Gyre's side of `npm run bench`, one run in a process of its own
 * (`node gyre-whole-path.js FILE.edf`, JSON on stdout): the built server on a fresh data folder
 * with its default embedded setup (SQLite, in-process worker pool), the file uploaded through
 * the HTTP API as a technician would, and the recording followed to `ready`.
 *
 * Stage boundaries come from the server's own audit trail, which stamps every state a
 * recording takes (received, validating, queued, computing, ready) in the transaction that
 * makes it: upload = request sent → file received and stored (`received`); validation →
 * `queued` (the server answers the upload then); computation → `ready` (waiting for a
 * thread, computing, storing the run); total = request sent → `ready`. The server's CPU
 * (/proc/<pid>/stat, every thread) is sampled every 50 ms and interpolated at each boundary.
 */
import { existsSync, mkdtempSync, openAsBlob, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { AnalysisRunView, Page, RecordingView, RecordingState } from '@gyre/shared';
import { AuditEntry } from '../audit/audit-entry.entity';
import { openServerDatabase } from '../robustness/crash/server-database';
import { seedCrashData } from '../robustness/crash/crash-seed';
import { GyreClient } from '../robustness/crash/gyre-client';
import { sleep, startServer, stopServer } from '../robustness/crash/server-process';
import {
  cpuAt,
  CpuSampler,
  processCpuS,
  processPeakBytes,
  processResidentBytes,
  wallClockMs,
} from './proc-usage';
import { errorMessage } from '../common/errors/error-message';

/** How often the server's CPU is read from /proc (costs the server nothing). */
export const CPU_SAMPLE_INTERVAL_MS = 50;
/**
 * How often the recording's state is asked for. Only to know when it is done: the stage
 * times come from the audit trail. Each poll costs the server a few ms of CPU (measured and
 * reported with every run), which every 50 ms would add about a tenth to its CPU figure.
 */
export const STATE_POLL_INTERVAL_MS = 500;
const JWT_SECRET = 'gyre-bench-run-secret-0123456789abcdefghijklmnop';

export interface StageFigures {
  wallS: number;
  /** Server CPU seconds (user + system, all threads). */
  cpuS: number;
}

export interface GyreRun {
  stages: {
    upload: StageFigures;
    validation: StageFigures;
    computation: StageFigures;
    total: StageFigures;
  };
  /** Seconds from sending the upload to its answer (the answer comes once the file is queued). */
  answerS: number;
  /** Seconds from sending the upload to the client seeing `ready` (at most one poll late). */
  readyObservedS: number;
  server: {
    /** Peak resident memory of the server process over its whole life (VmHWM), bytes. */
    peakBytes: number;
    /** Resident memory after start, before the upload (VmRSS), bytes. */
    idleBytes: number;
    /** Polls of the recording while it was followed, and the server CPU one poll costs. */
    polls: number;
    cpuPerPollS: number;
  };
  client: {
    /** The measuring process itself: CPU over the whole upload-to-result, and its peak. */
    cpuS: number;
    peakBytes: number;
  };
  fileBytes: number;
  recordingState: RecordingState;
  roi: {
    deltaFHz: number | null;
    ciHz: [number, number] | null;
    pValue: number | null;
    trialsKept: number | null;
    trialsTotal: number | null;
  };
}

/** First time (ms) the audit trail shows the recording in each state. */
async function stateTimes(dataDir: string, recordingId: string): Promise<Map<string, number>> {
  const dataSource = await openServerDatabase(dataDir);
  try {
    const entries = await dataSource.getRepository(AuditEntry).find({
      where: { objectType: 'Recording', objectId: recordingId },
      order: { seq: 'ASC' },
    });
    const times = new Map<string, number>();
    for (const entry of entries) {
      const state = (JSON.parse(entry.after ?? '{}') as { state?: string }).state;
      if (state && !times.has(state)) times.set(state, Date.parse(entry.at));
    }
    return times;
  } finally {
    await dataSource.destroy();
  }
}

async function seed(dataDir: string): Promise<Awaited<ReturnType<typeof seedCrashData>>> {
  const dataSource = await openServerDatabase(dataDir);
  try {
    return await seedCrashData(dataSource, 1);
  } finally {
    await dataSource.destroy();
  }
}

export async function measureGyreWholePath(edfPath: string): Promise<GyreRun> {
  const dataDir = mkdtempSync(join(tmpdir(), 'gyre-bench-data-'));
  const logFile = join(dataDir, 'server.log');
  const server = await startServer(dataDir, JWT_SECRET, logFile);
  const pid = server.child.pid;
  try {
    if (pid === undefined) throw new Error('the server process has no pid');
    const { emails, visitIds } = await seed(dataDir);
    const client = new GyreClient(server.url, emails);
    await client.connect(server.url);
    const file = await openAsBlob(edfPath);
    const form = new FormData();
    form.append('kind', 'task');
    form.append('file', file, 'recording.edf');
    const idleBytes = processResidentBytes(pid);

    const sampler = new CpuSampler(pid, CPU_SAMPLE_INTERVAL_MS);
    const clientCpu0 = process.cpuUsage();
    sampler.start();
    const sentAt = wallClockMs();
    const answer = await client.call<RecordingView>(
      'POST',
      `/api/visits/${visitIds[0]}/recordings`,
      'technician',
      { form },
    );
    const answeredAt = sampler.now().atMs;
    if (answer.status !== 201 || answer.body === null) {
      throw new Error(`upload: HTTP ${answer.status} ${JSON.stringify(answer.body)}`);
    }
    const id = answer.body.id;
    let polls = 0;
    let state: RecordingState = answer.body.state;
    while (state !== 'ready') {
      if (state === 'failed' || state === 'rejected' || state === 'superseded') {
        throw new Error(`the recording became ${state}`);
      }
      await sleep(STATE_POLL_INTERVAL_MS);
      const now = await client.call<RecordingView>('GET', `/api/recordings/${id}`, 'analyst');
      polls++;
      if (now.status !== 200 || now.body === null) {
        throw new Error(`GET /api/recordings/${id}: HTTP ${now.status}`);
      }
      state = now.body.state;
    }
    sampler.stop();
    const readyObservedAt = sampler.samples[sampler.samples.length - 1].atMs;
    const clientCpu = process.cpuUsage(clientCpu0);
    const peakBytes = processPeakBytes(pid);

    // What one poll costs the server, so that its share of the CPU figure can be judged.
    const probePolls = 40;
    const probe0 = processCpuS(pid);
    for (let i = 0; i < probePolls; i++) {
      await client.call<RecordingView>('GET', `/api/recordings/${id}`, 'analyst');
    }
    const cpuPerPollS = (processCpuS(pid) - probe0) / probePolls;

    const runs = await client.call<Page<AnalysisRunView>>(
      'GET',
      `/api/recordings/${id}/runs`,
      'analyst',
    );
    const run = runs.body?.items[0];
    if (!run) throw new Error(`GET /api/recordings/${id}/runs: no run (HTTP ${runs.status})`);
    await stopServer(server, 'SIGTERM');

    const times = await stateTimes(dataDir, id);
    const at = (s: RecordingState): number => {
      const t = times.get(s);
      if (t === undefined) throw new Error(`the audit trail has no "${s}" entry for ${id}`);
      return t;
    };
    const stage = (fromMs: number, toMs: number): StageFigures => ({
      wallS: (toMs - fromMs) / 1000,
      cpuS: cpuAt(sampler.samples, toMs) - cpuAt(sampler.samples, fromMs),
    });
    return {
      stages: {
        upload: stage(sentAt, at('received')),
        validation: stage(at('received'), at('queued')),
        computation: stage(at('queued'), at('ready')),
        total: stage(sentAt, at('ready')),
      },
      answerS: (answeredAt - sentAt) / 1000,
      readyObservedS: (readyObservedAt - sentAt) / 1000,
      server: { peakBytes, idleBytes, polls, cpuPerPollS },
      client: {
        cpuS: (clientCpu.user + clientCpu.system) / 1e6,
        peakBytes: process.resourceUsage().maxRSS * 1024,
      },
      fileBytes: file.size,
      recordingState: state,
      roi: {
        deltaFHz: run.roiDeltaFHz,
        ciHz: run.roiCiHz,
        pValue: run.roiPValue,
        trialsKept: run.trialsKept,
        trialsTotal: run.trialsTotal,
      },
    };
  } catch (error) {
    // The data folder goes with the run: keep the end of the server's log in the message.
    const log = existsSync(logFile) ? readFileSync(logFile, 'utf8').slice(-4000) : '';
    const message = errorMessage(error);
    throw new Error(`${message}\n--- end of the server log ---\n${log}`, { cause: error });
  } finally {
    await stopServer(server, 'SIGTERM');
    rmSync(dataDir, { recursive: true, force: true });
  }
}

if (require.main === module) {
  measureGyreWholePath(process.argv[2]).then(
    (run) => {
      process.stdout.write(`${JSON.stringify(run)}\n`);
      process.exit(0);
    },
    (error: unknown) => {
      console.error(error instanceof Error ? (error.stack ?? error.message) : String(error));
      process.exit(1);
    },
  );
}
