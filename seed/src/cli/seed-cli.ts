/**
 * The demo study, loaded into Gyre through its own HTTP API.
 *
 *   npm run seed                  seed an empty installation (starts a server if none is running)
 *   npm run seed -- --reset       first delete the database, uploads, captured mail and
 *                                 demo-accounts.txt of DATA_DIR (refused while Gyre is running)
 *   options: --small (three participants, short files) · --attach (used by npm start: the
 *            server is starting, seed it if empty)
 *
 * Environment: DATA_DIR (default ./data) and PORT (default 3000), as for the server.
 */
import { ChildProcess, spawn } from 'node:child_process';
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { buildDemoScenario } from '../scenario/demo-scenario';
import { formatAccountsForLog } from '../seeder/demo-accounts-file';
import { seedDemo } from '../seeder/demo-seeder';
import { firstAdminThroughCli } from '../seeder/first-admin-cli';

/** The repository root: the nearest folder above whose package.json is the `gyre` workspace root. */
function findRepoRoot(from: string): string {
  for (let dir = from; dir !== dirname(dir); dir = dirname(dir)) {
    const manifest = join(dir, 'package.json');
    if (
      existsSync(manifest) &&
      (JSON.parse(readFileSync(manifest, 'utf8')) as { name?: string }).name === 'gyre'
    ) {
      return dir;
    }
  }
  throw new Error(`no Gyre repository (package.json named 'gyre') above ${from}`);
}

const REPO_ROOT = findRepoRoot(__dirname);
const HEALTH_TIMEOUT_MS = 60_000;

/** A request the CLI turns down; nothing was changed. */
class Refusal extends Error {}

interface CliOptions {
  reset: boolean;
  small: boolean;
  attach: boolean;
}

function parseArguments(argv: readonly string[]): CliOptions {
  const known = new Set(['--reset', '--small', '--attach']);
  for (const arg of argv) {
    if (!known.has(arg)) {
      throw new Error(`argument '${arg}': unknown; expected --reset, --small or --attach`);
    }
  }
  return {
    reset: argv.includes('--reset'),
    small: argv.includes('--small'),
    attach: argv.includes('--attach'),
  };
}

const say = (line: string): void => {
  process.stdout.write(
    line
      .split('\n')
      .map((l) => `[demo] ${l}`)
      .join('\n') + '\n',
  );
};

async function isServing(baseUrl: string): Promise<boolean> {
  try {
    const response = await fetch(`${baseUrl}/api/health`, { signal: AbortSignal.timeout(2000) });
    return response.status === 200;
  } catch {
    return false;
  }
}

async function waitForHealth(baseUrl: string, server: ChildProcess | null): Promise<void> {
  const deadline = Date.now() + HEALTH_TIMEOUT_MS;
  while (!(await isServing(baseUrl))) {
    if (server !== null && server.exitCode !== null) {
      throw new Error(`the server stopped with exit code ${server.exitCode} before it was ready`);
    }
    if (Date.now() > deadline) throw new Error(`${baseUrl}/api/health did not answer within 60 s`);
    await new Promise((r) => setTimeout(r, 300));
  }
}

/** What `--reset` deletes: the database and everything that belongs to it. */
function resetTargets(dataDir: string): string[] {
  return [
    'gyre.sqlite',
    'gyre.sqlite-wal',
    'gyre.sqlite-shm',
    'uploads',
    'mail',
    'demo-accounts.txt',
  ].map((name) => join(dataDir, name));
}

async function main(): Promise<void> {
  const options = parseArguments(process.argv.slice(2));
  const dataDir = resolve(process.env.DATA_DIR ?? './data');
  const port = Number(process.env.PORT ?? 3000);
  const baseUrl = `http://127.0.0.1:${port}`;
  const signInUrl = (process.env.PUBLIC_URL ?? `http://localhost:${port}`).replace(/\/+$/, '');

  if (options.reset) {
    if (await isServing(baseUrl)) {
      throw new Refusal(
        `Gyre is running on port ${port} and holds the database: stop it first, then run npm run seed -- --reset`,
      );
    }
    say(`--reset: deleting the demo's data in ${dataDir}:`);
    for (const target of resetTargets(dataDir)) {
      if (!existsSync(target)) continue;
      rmSync(target, { recursive: true, force: true });
      say(`  deleted ${target}`);
    }
    say('  (kept: secrets/, the sign-in secret)');
  }

  if (options.attach) {
    // npm start passes Ctrl-C on to us too: say how to get a complete demo afterwards.
    for (const signal of ['SIGINT', 'SIGTERM'] as const) {
      process.on(signal, () => {
        say(
          'demo seeding interrupted; for the complete demo: stop Gyre, then npm run seed -- --reset',
        );
        process.exit(130);
      });
    }
  }
  let server: ChildProcess | null = null;
  if (!options.attach && !(await isServing(baseUrl))) {
    say(`starting Gyre on port ${port} for seeding`);
    server = spawn(process.execPath, [require.resolve('@gyre/backend')], {
      cwd: REPO_ROOT,
      env: { ...process.env, DATA_DIR: dataDir, PORT: String(port), LOG_LEVEL: 'warn' },
      stdio: ['ignore', 'inherit', 'inherit'],
    });
    const stop = (): void => {
      server?.kill('SIGTERM');
    };
    process.on('SIGINT', stop);
    process.on('SIGTERM', stop);
  }
  try {
    await waitForHealth(baseUrl, server);
    const scenario = buildDemoScenario(options.small ? 'small' : 'full');
    say(`seeding the invented demo study "${scenario.study.name}" through the API at ${baseUrl}`);
    const result = await seedDemo({
      baseUrl,
      dataDir,
      signInUrl,
      scenario,
      createFirstAdmin: firstAdminThroughCli({ dataDir }),
      log: say,
    });
    if (result.status === 'not-empty') {
      if (!options.attach) {
        throw new Refusal(
          'this installation already has accounts; to replace it with the demo, stop Gyre and run npm run seed -- --reset',
        );
      }
      return;
    }
    const states = Object.entries(result.recordingStates)
      .map(([state, count]) => `${count} ${state}`)
      .join(', ');
    say(
      `demo ready in ${(result.timingsMs.total / 1000).toFixed(1)} s ` +
        `(accounts ${(result.timingsMs.accounts / 1000).toFixed(1)} s, uploads ${(result.timingsMs.uploads / 1000).toFixed(1)} s, ` +
        `computing after the last upload ${(result.timingsMs.results / 1000).toFixed(1)} s): ${states}`,
    );
    // Passwords stay in the 0600 accounts file; the log only says who and where.
    say(
      formatAccountsForLog(result.credentials, signInUrl, result.accountsFile ?? 'the data folder'),
    );
  } finally {
    if (server !== null && server.exitCode === null) {
      const exited = new Promise((r) => server?.once('exit', r));
      server.kill('SIGTERM');
      await exited;
      say('seeding server stopped; start Gyre with npm start');
    }
  }
}

main().catch((error: unknown) => {
  if (error instanceof Refusal) {
    say(`not seeding: ${error.message}`);
    process.exit(2);
  }
  say(`seeding failed: ${error instanceof Error ? error.message : String(error)}`);
  say('to start over: stop Gyre, then npm run seed -- --reset');
  process.exit(1);
});
