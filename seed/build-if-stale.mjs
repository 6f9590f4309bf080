// Compiles the demo seeder (seed/ → seed/dist/) when its output is older than its sources.
// The seeder uses the signal core's public API (`@gyre/backend/signal`, from backend/dist: build
// the backend first, as `npm run seed` does), so its sources and the package entry count too.
import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';

const root = resolve(import.meta.dirname, '..');
export const SEED_CLI = join(root, 'seed/dist/seed/src/cli/seed-cli.js');
const INPUTS = [
  'seed/src',
  'seed/tsconfig.json',
  'seed/tsconfig.build.json',
  'backend/src/signal',
  'backend/package.json',
];

function newestMtime(path) {
  if (!existsSync(path)) return 0;
  const stats = statSync(path);
  if (!stats.isDirectory()) return stats.mtimeMs;
  return Math.max(0, ...readdirSync(path).map((entry) => newestMtime(join(path, entry))));
}

export function buildSeedIfStale() {
  const builtAt = existsSync(SEED_CLI) ? statSync(SEED_CLI).mtimeMs : 0;
  const changedAt = Math.max(...INPUTS.map((input) => newestMtime(join(root, input))));
  if (builtAt === 0 || changedAt > builtAt) {
    console.log('Building seed…');
    execFileSync(
      process.execPath,
      [join(root, 'node_modules/typescript/bin/tsc'), '-p', 'seed/tsconfig.build.json'],
      { cwd: root, stdio: 'inherit' },
    );
  }
}

if (import.meta.url === `file://${process.argv[1]}`) buildSeedIfStale();
