// `npm start`: builds what is not built, then runs the server (migrations apply at boot).
import { spawn } from 'node:child_process';
import { resolve } from 'node:path';
import { buildIfStale } from './build-if-stale.mjs';

const root = resolve(import.meta.dirname, '..');
buildIfStale();

const server = spawn(process.execPath, [resolve(root, 'backend/dist/main.js')], {
  cwd: root,
  stdio: 'inherit',
  env: process.env,
});
for (const signal of ['SIGINT', 'SIGTERM']) {
  process.on(signal, () => server.kill(signal));
}
server.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
