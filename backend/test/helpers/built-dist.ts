import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
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
