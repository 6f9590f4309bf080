// Compiles the demo seeder (seed/ → seed/dist/) when its output is older than its sources.
// The seeder uses the signal core's public API (`@gyre/backend/signal`, from backend/dist: build
// the backend first, as `npm run seed` does), so its sources and the package entry count too.
import { execFileSync } from 'node:child_process';
import { join, resolve } from 'node:path';
import { isStale } from '../scripts/build-if-stale.mjs';

const root = resolve(import.meta.dirname, '..');
const OUTPUT = 'seed/dist/seed/src/cli/seed-cli.js';
export const SEED_CLI = join(root, OUTPUT);
const INPUTS = [
  'seed/src',
  'seed/tsconfig.json',
  'seed/tsconfig.build.json',
  'backend/src/signal',
  'backend/package.json',
];

export function buildSeedIfStale() {
  if (isStale(OUTPUT, INPUTS)) {
    console.log('Building seed…');
    execFileSync(
      process.execPath,
      [join(root, 'node_modules/typescript/bin/tsc'), '-p', 'seed/tsconfig.build.json'],
      { cwd: root, stdio: 'inherit' },
    );
  }
}

if (import.meta.url === `file://${process.argv[1]}`) buildSeedIfStale();
