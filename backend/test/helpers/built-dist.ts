import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';

/** The repository root, for tests that run the built server or its command lines. */
export const REPO = resolve(__dirname, '..', '..', '..');

function newestMtime(path: string): number {
  if (!existsSync(path)) return 0;
  const stats = statSync(path);
  if (!stats.isDirectory()) return stats.mtimeMs;
  return Math.max(0, ...readdirSync(path).map((entry) => newestMtime(join(path, entry))));
}

/**
 * Rebuilds shared/ and the backend when `entry` (a file under the repository, e.g.
 * `backend/dist/main.js`) is older than a source: the rule of scripts/build-if-stale.mjs.
 * `npm test` builds before jest starts, so in the suite this costs nothing; after an edit and
 * a lone `npx jest test/…` it saves running stale code.
 */
export function buildDistIfStale(entry: string): void {
  const built = Math.min(
    newestMtime(join(REPO, entry)) || 0,
    newestMtime(join(REPO, 'shared/dist/index.js')) || 0,
  );
  const sources = Math.max(
    ...['backend/src', 'backend/tsconfig.json', 'backend/tsconfig.build.json', 'shared/src'].map(
      (p) => newestMtime(join(REPO, p)),
    ),
  );
  if (built !== 0 && sources <= built) return;
  execFileSync('npm', ['run', 'build', '-w', 'shared'], { cwd: REPO, stdio: 'ignore' });
  execFileSync('npx', ['tsc', '-p', 'backend/tsconfig.build.json'], {
    cwd: REPO,
    stdio: 'inherit',
  });
}

/**
 * Runs a built command line (`cli`, a file under the repository, rebuilt first when stale)
 * with `args` and `--json <file>`, in a process of its own, and answers the JSON report it
 * wrote. Its exit code is not judged (1 means a check failed): the report says which, and the
 * tests judge it. `what` names the run when it writes no report.
 */
export function builtCliReport<T>(cli: string, args: string[], timeoutMs: number, what: string): T {
  buildDistIfStale(cli);
  const out = mkdtempSync(join(tmpdir(), 'gyre-cli-report-'));
  const json = join(out, 'report.json');
  const run = spawnSync(process.execPath, [join(REPO, cli), ...args, '--json', json], {
    encoding: 'utf8',
    timeout: timeoutMs,
  });
  if (!existsSync(json)) throw new Error(`${what} gave no report:\n${run.stdout}\n${run.stderr}`);
  const report = JSON.parse(readFileSync(json, 'utf8')) as T;
  rmSync(out, { recursive: true, force: true });
  return report;
}
