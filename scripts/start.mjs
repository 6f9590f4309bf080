// `npm start`: builds what is not built, then runs the server (migrations apply at boot).
// On a fresh data folder (no database yet) it also loads the invented demo study through the
// API while the server runs (seed/; GYRE_DEMO=off skips it).
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { buildIfStale } from './build-if-stale.mjs';
import { buildSeedIfStale, SEED_CLI } from '../seed/build-if-stale.mjs';

const root = resolve(import.meta.dirname, '..');
const dataDir = resolve(root, process.env.DATA_DIR ?? 'data');
const seedDemo = process.env.GYRE_DEMO !== 'off' && !existsSync(join(dataDir, 'gyre.sqlite'));
buildIfStale();
if (seedDemo) buildSeedIfStale();

const server = spawn(process.execPath, [resolve(root, 'backend/dist/main.js')], {
  cwd: root,
  stdio: 'inherit',
  env: process.env,
});
const seeder = seedDemo
  ? spawn(process.execPath, [SEED_CLI, '--attach'], {
      cwd: root,
      stdio: 'inherit',
      env: { ...process.env, DATA_DIR: dataDir },
    })
  : null;
for (const signal of ['SIGINT', 'SIGTERM']) {
  process.on(signal, () => {
    seeder?.kill(signal);
    server.kill(signal);
  });
}
server.on('exit', (code, signal) => {
  seeder?.kill('SIGTERM');
  process.exit(code ?? (signal ? 1 : 0));
});
