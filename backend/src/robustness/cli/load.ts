/**
 * `npm run load [-- --clients N] [--seconds N]`
 *
 * A load figure for docs/reliability.md, not a test: starts the built server on a fresh data
 * folder, uploads one generated resting and one task recording, waits for their results, then
 * has N concurrent clients (default 50) read the heaviest answers in a loop for S seconds each
 * (default 20): a task recording's results, the participants list and a trajectory. Prints
 * requests, errors and latency percentiles per route, then times a backup of the folder while
 * the server runs. Needs a built backend.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Page, ParticipantView, RecordingDto } from '@gyre/shared';
import { DataSource } from 'typeorm';
import { createBackup } from '../../backup/backup';
import { sqliteOptions } from '../../database/database-options';
import { seedCrashData } from '../crash/crash-seed';
import { GyreClient } from '../crash/gyre-client';
import { QUICK_SIZES, restingUpload, taskUpload } from '../crash/recording-files';
import { sleep, startServer, stopServer } from '../crash/server-process';
import { Rng } from '../seeded-random';
import { machineDescription } from './fuzz';

const JWT_SECRET = 'gyre-load-run-secret-0123456789abcdefghijklmnop';

interface RouteFigures {
  route: string;
  requests: number;
  errors: number;
  p50Ms: number;
  p99Ms: number;
  maxMs: number;
}

function option(argv: readonly string[], name: string, fallback: number): number {
  const at = argv.indexOf(name);
  if (at === -1) return fallback;
  const value = Number(argv[at + 1]);
  if (!Number.isSafeInteger(value) || value < 1) throw new Error(`${name}: a positive integer`);
  return value;
}

function percentile(sorted: readonly number[], share: number): number {
  if (sorted.length === 0) return 0;
  return sorted[Math.min(sorted.length - 1, Math.floor(share * sorted.length))];
}

async function upload(client: GyreClient, visitId: string, form: FormData): Promise<RecordingDto> {
  const response = await client.call<RecordingDto>(
    'POST',
    `/api/visits/${visitId}/recordings`,
    'technician',
    { form },
  );
  if (response.status !== 201 || response.body === null) {
    throw new Error(`upload: HTTP ${response.status}`);
  }
  return response.body;
}

async function main(): Promise<number> {
  const argv = process.argv.slice(2);
  const clients = option(argv, '--clients', 50);
  const seconds = option(argv, '--seconds', 20);
  const dataDir = mkdtempSync(join(tmpdir(), 'gyre-load-'));
  const server = await startServer(dataDir, JWT_SECRET, join(dataDir, 'server.log'));
  const dataSource = new DataSource({
    ...sqliteOptions(join(dataDir, 'gyre.sqlite')),
    migrationsRun: false,
  });
  await dataSource.initialize();
  try {
    const seed = await seedCrashData(dataSource, 1);
    const client = new GyreClient(server.url, seed.emails);
    await client.connect(server.url);
    const rng = new Rng(20260115);
    const visitId = seed.visitIds[0];
    const files = [restingUpload(rng, QUICK_SIZES, 1), taskUpload(rng, QUICK_SIZES, 2)];
    let task: RecordingDto | null = null;
    for (const file of files) {
      const form = new FormData();
      form.append('kind', file.kind);
      form.append('file', new Blob([new Uint8Array(file.bytes)]), `${file.kind}.edf`);
      if (file.onsetsCsv !== null) form.append('onsets', new Blob([file.onsetsCsv]), 'onsets.csv');
      const accepted = await upload(client, visitId, form);
      if (file.kind === 'task') task = accepted;
    }
    if (task === null) throw new Error('no task recording');
    for (;;) {
      const now = await client.call<RecordingDto>('GET', `/api/recordings/${task.id}`, 'analyst');
      if (now.body?.state === 'ready') break;
      if (now.body?.state === 'failed' || now.body?.state === 'rejected') {
        throw new Error(`task recording ${now.body.state}`);
      }
      await sleep(200);
    }
    const participants = await client.call<Page<ParticipantView>>(
      'GET',
      '/api/participants',
      'analyst',
    );
    const participantId = participants.body?.items[0]?.id ?? '';
    const routes = [
      `/api/recordings/${task.id}/results`,
      '/api/participants',
      `/api/participants/${participantId}/trajectory`,
    ];
    const times = new Map<string, number[]>(routes.map((r) => [r, []]));
    const errors = new Map<string, number>(routes.map((r) => [r, 0]));
    const until = performance.now() + seconds * 1000;
    const started = performance.now();
    await Promise.all(
      Array.from({ length: clients }, async (_, c) => {
        for (let i = c; performance.now() < until; i++) {
          const route = routes[i % routes.length];
          const t0 = performance.now();
          const response = await client.call('GET', route, 'analyst');
          times.get(route)?.push(performance.now() - t0);
          if (response.status !== 200) errors.set(route, (errors.get(route) ?? 0) + 1);
        }
      }),
    );
    const wallS = (performance.now() - started) / 1000;
    const figures: RouteFigures[] = routes.map((route) => {
      const sorted = [...(times.get(route) ?? [])].sort((a, b) => a - b);
      return {
        route: route.replace(/[0-9a-f-]{36}/g, ':id'),
        requests: sorted.length,
        errors: errors.get(route) ?? 0,
        p50Ms: Math.round(percentile(sorted, 0.5)),
        p99Ms: Math.round(percentile(sorted, 0.99)),
        maxMs: Math.round(sorted.at(-1) ?? 0),
      };
    });
    console.log(
      `load: ${clients} clients for ${seconds} s (${wallS.toFixed(1)} s wall) on ${machineDescription()}`,
    );
    for (const f of figures) {
      console.log(
        `  ${f.route}: ${f.requests} requests (${(f.requests / wallS).toFixed(0)}/s), ${f.errors} errors, p50 ${f.p50Ms} ms, p99 ${f.p99Ms} ms, max ${f.maxMs} ms`,
      );
    }
    // A backup of the folder while the server runs, for the backup figure beside the load.
    const backupDir = join(tmpdir(), `gyre-load-backup-${process.pid}`);
    const backupStarted = performance.now();
    const backup = await createBackup({ dataDir, outDir: backupDir });
    const backupMs = performance.now() - backupStarted;
    const backupBytes = backup.manifest.files.reduce((sum, f) => sum + f.bytes, 0);
    console.log(
      `  backup while serving: ${backup.manifest.files.length} files, ${(backupBytes / 1e6).toFixed(1)} MB in ${Math.round(backupMs)} ms`,
    );
    rmSync(backupDir, { recursive: true, force: true });
    return figures.some((f) => f.errors > 0) ? 1 : 0;
  } finally {
    await dataSource.destroy();
    await stopServer(server, 'SIGTERM');
    rmSync(dataDir, { recursive: true, force: true });
  }
}

main().then(
  (code) => process.exit(code),
  (error: unknown) => {
    console.error(`load: ${error instanceof Error ? error.message : String(error)}`);
    process.exit(1);
  },
);
