// Builds each workspace whose output is older than its sources (or missing).
import { execFileSync } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join, resolve } from 'node:path';

const root = resolve(import.meta.dirname, '..');

const targets = [
  {
    workspace: 'shared',
    output: 'shared/dist/index.js',
    inputs: ['shared/src', 'shared/tsconfig.json'],
  },
  {
    workspace: 'backend',
    output: 'backend/dist/main.js',
    inputs: [
      'backend/src',
      'backend/tsconfig.json',
      'backend/tsconfig.build.json',
      'backend/package.json',
    ],
  },
  {
    workspace: 'frontend',
    output: 'frontend/dist/index.html',
    inputs: [
      'frontend/src',
      'frontend/index.html',
      'frontend/vite.config.ts',
      'frontend/public',
      'shared/src',
    ],
  },
];

function newestMtime(path) {
  if (!existsSync(path)) return 0;
  const stats = statSync(path);
  if (!stats.isDirectory()) return stats.mtimeMs;
  let newest = 0;
  for (const entry of readdirSync(path)) {
    newest = Math.max(newest, newestMtime(join(path, entry)));
  }
  return newest;
}

/** Whether `output` is missing or older than one of `inputs` (paths under the repository). */
export function isStale(output, inputs) {
  const outputPath = join(root, output);
  const builtAt = existsSync(outputPath) ? statSync(outputPath).mtimeMs : 0;
  const changedAt = Math.max(...inputs.map((input) => newestMtime(join(root, input))));
  return builtAt === 0 || changedAt > builtAt;
}

export function buildIfStale({ force = false } = {}) {
  for (const target of targets) {
    if (force || isStale(target.output, target.inputs)) {
      console.log(`Building ${target.workspace}…`);
      execFileSync('npm', ['run', '-s', 'build', '-w', target.workspace], {
        cwd: root,
        stdio: 'inherit',
      });
    }
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  buildIfStale({ force: process.argv.includes('--force') });
}
