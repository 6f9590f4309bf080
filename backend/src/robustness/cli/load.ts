/**
 * `npm run load [-- --clients N] [--seconds N] [--participants N] [--routes NAME,…]
 * [--cpu-prof DIR]`
 *
 * A load figure for docs/reliability.md and docs/performance.md, not a test: starts the built
 * server on a fresh data folder, gives one participant three visits, each with a generated
 * 64-channel resting and task recording, waits until every result is computed, then drives
 * each route in turn with autocannon: N concurrent connections (default 50) for S seconds
 * (default 20), sending what a browser sends (a bearer token, `Accept-Encoding: gzip, deflate,
 * br`). Prints per route the requests, errors, p50/p99/max latency and bytes on the wire, then
 * times a backup of the folder while the server runs. Client and server share the machine's
 * cores; the load average is printed beside the figures. Needs a built backend.
 *
 * `--routes` drives only the named routes (results, raster, curves, participants, trajectory);
 * `--cpu-prof DIR` records the server's CPU profile over the whole run and leaves it in DIR (a
 * `.cpuprofile` for Chrome DevTools' Performance panel; see server-cpu-profile.ts). The flags are
 * read by node:util parseArgs (`--flag value` or `--flag=value`); `--help` prints the usage.
 */
import { copyFileSync, mkdirSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import { loadavg, tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { parseArgs } from 'node:util';
import autocannon from 'autocannon';
import type { Page, ParticipantView, RecordingView, RecordingResultsView } from '@gyre/shared';
import { createBackup } from '../../backup/backup';
import { openServerDatabase } from '../crash/server-database';
import { CRASH_PASSWORD, seedCrashData } from '../crash/crash-seed';
import { sleep, startServer, stopServer } from '../crash/server-process';
import { machineDescription } from './fuzz';
import { LABELS_64, rest64Edf, task64Edf } from './load-recordings';
import { errorMessage } from '../../common/errors/error-message';

const JWT_SECRET = 'gyre-load-run-secret-0123456789abcdefghijklmnop';
const BROWSER_ENCODINGS = 'gzip, deflate, br';
const ROUTE_NAMES = ['results', 'raster', 'curves', 'participants', 'trajectory'] as const;
type RouteName = (typeof ROUTE_NAMES)[number];
const VISITS = [
  { label: 'V1', date: '2026-01-15', peakHz: 10.2 },
  { label: 'V2', date: '2026-07-15', peakHz: 10.0 },
  { label: 'V3', date: '2027-01-15', peakHz: 9.8 },
];

interface RouteFigures {
  route: string;
  requests: number;
  errors: number;
  p50Ms: number;
  p99Ms: number;
  maxMs: number;
  /** Bytes a response took on the wire, headers included (autocannon's throughput / requests). */
  wireBytes: number;
  /** The server process's CPU time per request, ms (null where /proc is not there). */
  serverCpuMs: number | null;
}

/**
 * CPU time (user + system) a process has used, ms, from /proc/<pid>/stat (proc(5): fields 14
 * and 15, in clock ticks of 1/100 s on Linux); null elsewhere. Unlike latency, it hardly
 * depends on what else the machine runs.
 */
function cpuMsOf(pid: number | undefined): number | null {
  if (pid === undefined) return null;
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
    // The command name (field 2) may hold spaces: count fields after its closing parenthesis.
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    return (Number(fields[11]) + Number(fields[12])) * 10;
  } catch {
    return null;
  }
}

const USAGE =
  'usage: npm run load [-- --clients N] [--seconds N] [--participants N] [--routes NAME,…] ' +
  `[--cpu-prof DIR]; routes: ${ROUTE_NAMES.join(', ')}`;

/** What `npm run load` was asked for; null when --help printed the usage. */
export interface LoadArguments {
  clients: number;
  seconds: number;
  participants: number;
  routes: Set<RouteName>;
  cpuProfileDir: string | null;
}

function positiveInteger(name: string, text: string | undefined, fallback: number): number {
  if (text === undefined) return fallback;
  const value = Number(text);
  if (!Number.isSafeInteger(value) || value < 1) {
    throw new Error(`--${name}: a positive integer, got "${text}"`);
  }
  return value;
}

function routesOf(text: string | undefined): Set<RouteName> {
  if (text === undefined) return new Set(ROUTE_NAMES);
  const names = text.split(',').map((n) => n.trim());
  const unknown = names.filter((n) => !(ROUTE_NAMES as readonly string[]).includes(n));
  if (unknown.length > 0) {
    throw new Error(`--routes: unknown ${unknown.join(', ')}; known: ${ROUTE_NAMES.join(', ')}`);
  }
  return new Set(names as RouteName[]);
}

/** The command line, read by node:util parseArgs (unknown options and missing values refused). */
export function parseLoadArguments(argv: readonly string[]): LoadArguments | null {
  const { values } = parseArgs({
    args: [...argv],
    options: {
      clients: { type: 'string' },
      seconds: { type: 'string' },
      participants: { type: 'string' },
      routes: { type: 'string' },
      'cpu-prof': { type: 'string' },
      help: { type: 'boolean' },
    },
    strict: true,
    allowPositionals: false,
  });
  if (values.help === true) {
    console.log(USAGE);
    return null;
  }
  return {
    clients: positiveInteger('clients', values.clients, 50),
    seconds: positiveInteger('seconds', values.seconds, 20),
    participants: positiveInteger('participants', values.participants, 24),
    routes: routesOf(values.routes),
    cpuProfileDir: values['cpu-prof'] ?? null,
  };
}

/** The environment of a profiled server (see server-cpu-profile.ts). */
function profiledServerEnv(dir: string | null): Record<string, string> {
  if (dir === null) return {};
  mkdirSync(dir, { recursive: true });
  return {
    // Quoted: NODE_OPTIONS splits on spaces otherwise.
    NODE_OPTIONS: `--require="${join(__dirname, 'server-cpu-profile.js')}"`,
    GYRE_CPU_PROFILE_DIR: resolve(dir),
  };
}

function load(): string {
  return loadavg()
    .map((v) => v.toFixed(2))
    .join(', ');
}

async function api<T>(
  url: string,
  method: 'GET' | 'POST',
  path: string,
  token: string | null,
  body?: { json?: unknown; form?: FormData },
): Promise<{ status: number; body: T }> {
  const headers: Record<string, string> = {};
  if (token !== null) headers.Authorization = `Bearer ${token}`;
  if (body?.json !== undefined) headers['Content-Type'] = 'application/json';
  const response = await fetch(`${url}${path}`, {
    method,
    headers,
    body: body?.json !== undefined ? JSON.stringify(body.json) : body?.form,
  });
  return { status: response.status, body: (await response.json()) as T };
}

async function signIn(url: string, email: string): Promise<string> {
  const response = await api<{ accessToken: string }>(url, 'POST', '/api/auth/sign-in', null, {
    json: { email, password: CRASH_PASSWORD },
  });
  if (response.status !== 200) throw new Error(`sign-in of ${email}: HTTP ${response.status}`);
  return response.body.accessToken;
}

async function uploadEdf(
  url: string,
  token: string,
  visitId: string,
  kind: 'resting' | 'task',
  bytes: Uint8Array,
): Promise<RecordingView> {
  const form = new FormData();
  form.append('kind', kind);
  form.append('file', new Blob([new Uint8Array(bytes)]), `${kind}.edf`);
  const response = await api<RecordingView>(
    url,
    'POST',
    `/api/visits/${visitId}/recordings`,
    token,
    {
      form,
    },
  );
  if (response.status !== 201) throw new Error(`upload ${kind}: HTTP ${response.status}`);
  return response.body;
}

/** Waits until every recording is ready and stays so (a resting IAF may re-run its task). */
async function allReady(url: string, token: string, ids: readonly string[]): Promise<void> {
  let settledRounds = 0;
  for (;;) {
    const states = await Promise.all(
      ids.map(
        async (id) => (await api<RecordingView>(url, 'GET', `/api/recordings/${id}`, token)).body,
      ),
    );
    const bad = states.find((r) => r.state === 'failed' || r.state === 'rejected');
    if (bad !== undefined) throw new Error(`recording ${bad.id} ${bad.state}`);
    settledRounds = states.every((r) => r.state === 'ready') ? settledRounds + 1 : 0;
    if (settledRounds === 3) return;
    await sleep(500);
  }
}

/** One GET as a browser asks it: the body's bytes as sent (still encoded) and its encoding. */
function wireSize(
  url: string,
  path: string,
  token: string,
  acceptEncoding: string,
): Promise<{ status: number; bytes: number; encoding: string }> {
  return new Promise((done, fail) => {
    const request = httpRequest(
      `${url}${path}`,
      { headers: { Authorization: `Bearer ${token}`, 'Accept-Encoding': acceptEncoding } },
      (response) => {
        let bytes = 0;
        response.on('data', (chunk: Buffer) => (bytes += chunk.length));
        response.on('end', () =>
          done({
            status: response.statusCode ?? 0,
            bytes,
            encoding: String(response.headers['content-encoding'] ?? 'identity'),
          }),
        );
      },
    );
    request.on('error', fail);
    request.end();
  });
}

async function drive(
  url: string,
  path: string,
  token: string,
  connections: number,
  seconds: number,
  serverPid: number | undefined,
): Promise<RouteFigures> {
  const cpuBefore = cpuMsOf(serverPid);
  const result = await autocannon({
    url: `${url}${path}`,
    connections,
    duration: seconds,
    headers: { authorization: `Bearer ${token}`, 'accept-encoding': BROWSER_ENCODINGS },
  });
  const requests = result['2xx'] + result.non2xx;
  const cpuAfter = cpuMsOf(serverPid);
  return {
    route: path.replace(/[0-9a-f-]{36}/g, ':id').replace(/channel=[^&]+/, 'channel=…'),
    requests,
    errors: result.errors + result.non2xx,
    p50Ms: result.latency.p50,
    p99Ms: result.latency.p99,
    maxMs: result.latency.max,
    wireBytes: requests === 0 ? 0 : Math.round(result.throughput.total / requests),
    serverCpuMs:
      cpuBefore === null || cpuAfter === null || requests === 0
        ? null
        : (cpuAfter - cpuBefore) / requests,
  };
}

async function main(): Promise<number> {
  const parsed = parseLoadArguments(process.argv.slice(2));
  if (parsed === null) return 0;
  const {
    clients,
    seconds,
    participants: participantCount,
    routes: wanted,
    cpuProfileDir: profileDir,
  } = parsed;
  const dataDir = mkdtempSync(join(tmpdir(), 'gyre-load-'));
  const server = await startServer(
    dataDir,
    JWT_SECRET,
    join(dataDir, 'server.log'),
    undefined,
    profiledServerEnv(profileDir),
  );
  server.child.once('exit', (code, signal) => {
    // A profiled server exits normally after its shutdown hooks (server-cpu-profile.ts).
    const stopped = signal === 'SIGTERM' || (profileDir !== null && code === 0);
    if (!stopped) console.error(`load: the server stopped (exit ${code}, ${signal})`);
  });
  const dataSource = await openServerDatabase(dataDir);
  try {
    const seed = await seedCrashData(dataSource, participantCount);
    const technician = await signIn(server.url, seed.emails.technician);
    const analyst = await signIn(server.url, seed.emails.analyst);
    const participants = await api<Page<ParticipantView>>(
      server.url,
      'GET',
      '/api/participants',
      analyst,
    );
    const participantId = participants.body.items[0]?.id ?? '';
    const visitIds = [seed.visitIds[0]];
    for (const visit of VISITS.slice(1)) {
      const created = await api<{ id: string }>(server.url, 'POST', '/api/visits', technician, {
        json: { participantId, label: visit.label, visitDate: visit.date },
      });
      if (created.status !== 201) throw new Error(`visit ${visit.label}: HTTP ${created.status}`);
      visitIds.push(created.body.id);
    }
    // Every file first: generating one takes seconds, long enough for the server to close an
    // idle keep-alive connection just as the next upload starts on it (EPIPE).
    const files = VISITS.map((visit, i) => ({
      rest: rest64Edf({ durationS: 90, seed: 100 + i, peakHz: visit.peakHz }),
      task: task64Edf({ durationS: 120, seed: 200 + i, baseFrequencyHz: visit.peakHz }),
    }));
    const prepared = performance.now();
    const uploaded: RecordingView[] = [];
    for (const [i, file] of files.entries()) {
      uploaded.push(await uploadEdf(server.url, technician, visitIds[i], 'resting', file.rest));
      uploaded.push(await uploadEdf(server.url, technician, visitIds[i], 'task', file.task));
    }
    await allReady(
      server.url,
      analyst,
      uploaded.map((r) => r.id),
    );
    const task = uploaded[1];
    console.log(
      `load: ${participantCount} participants; ${uploaded.length} recordings of ${LABELS_64.length} channels computed in ${((performance.now() - prepared) / 1000).toFixed(1)} s`,
    );

    const resultsPath = `/api/recordings/${task.id}/results`;
    const results = await api<RecordingResultsView>(server.url, 'GET', resultsPath, analyst);
    const channel = results.body.task?.curveChannels[0];
    const paths: Record<RouteName, string | null> = {
      results: resultsPath,
      raster: `/api/recordings/${task.id}/results/raster`,
      curves:
        channel === undefined
          ? null
          : `/api/recordings/${task.id}/results/curves?channel=${encodeURIComponent(channel)}`,
      participants: '/api/participants',
      trajectory: `/api/participants/${participantId}/trajectory`,
    };
    const routes = ROUTE_NAMES.flatMap((name) => {
      const path = paths[name];
      return wanted.has(name) && path !== null ? [path] : [];
    });
    console.log(`sizes of one answer (body bytes; load average ${load()}):`);
    for (const path of routes) {
      const plain = await wireSize(server.url, path, analyst, 'identity');
      const gzip = await wireSize(server.url, path, analyst, 'gzip');
      const browser = await wireSize(server.url, path, analyst, BROWSER_ENCODINGS);
      console.log(
        `  ${path.replace(/[0-9a-f-]{36}/g, ':id')}: HTTP ${plain.status}, ${plain.bytes} B as JSON, ${gzip.bytes} B ${gzip.encoding}, ${browser.bytes} B ${browser.encoding}`,
      );
    }

    console.log(
      `autocannon: ${clients} connections for ${seconds} s per route, on ${machineDescription()}`,
    );
    const figures: RouteFigures[] = [];
    for (const path of routes) {
      const before = load();
      const f = await drive(server.url, path, analyst, clients, seconds, server.child.pid);
      figures.push(f);
      console.log(
        `  ${f.route}: ${f.requests} requests (${(f.requests / seconds).toFixed(0)}/s), ${f.errors} errors, p50 ${f.p50Ms} ms, p99 ${f.p99Ms} ms, max ${f.maxMs} ms, ${f.wireBytes} B/response on the wire, server CPU ${f.serverCpuMs === null ? 'unknown' : `${f.serverCpuMs.toFixed(2)} ms`}/request; load average before ${before}, after ${load()}`,
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
  } catch (error) {
    // The server's own log says why a request failed; the data folder goes, the log stays.
    const kept = join(tmpdir(), `gyre-load-server-${process.pid}.log`);
    copyFileSync(join(dataDir, 'server.log'), kept);
    console.error(`load: the server's log is in ${kept}`);
    throw error;
  } finally {
    await dataSource.destroy();
    await stopServer(server, 'SIGTERM');
    rmSync(dataDir, { recursive: true, force: true });
    if (profileDir !== null) console.log(`load: the server's CPU profile is in ${profileDir}`);
  }
}

if (require.main === module) {
  main().then(
    (code) => process.exit(code),
    (error: unknown) => {
      // fetch names the network failure only in its cause (ECONNRESET, ECONNREFUSED, …).
      const cause = error instanceof Error && error.cause instanceof Error ? error.cause : null;
      console.error(`load: ${errorMessage(error)}${cause === null ? '' : ` (${cause.message})`}`);
      process.exit(1);
    },
  );
}
