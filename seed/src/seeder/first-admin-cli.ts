/**
 * Creates the first admin through the backend's demo hook (its package entry
 * `@gyre/backend/create-first-admin`), in a child process against the same DATA_DIR. The
 * password travels on stdin only.
 */
import { spawn } from 'node:child_process';
import type { CreateFirstAdmin } from './demo-seeder';

export function firstAdminThroughCli(options: { dataDir: string }): CreateFirstAdmin {
  return (input) =>
    new Promise((resolve, reject) => {
      let script: string;
      try {
        script = require.resolve('@gyre/backend/create-first-admin');
      } catch {
        reject(
          new Error(
            '@gyre/backend/create-first-admin is missing: build the backend first (npm run build -w backend)',
          ),
        );
        return;
      }
      const child = spawn(process.execPath, [script], {
        env: { ...process.env, DATA_DIR: options.dataDir, LOG_LEVEL: 'error' },
        stdio: ['pipe', 'pipe', 'pipe'],
      });
      let stderr = '';
      child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
      child.stdout.resume();
      child.on('error', reject);
      child.on('exit', (code) => {
        if (code === 0) resolve({ created: true });
        else if (code === 3) resolve({ created: false });
        else reject(new Error(`create-first-admin exited with ${code}: ${stderr.trim()}`));
      });
      child.stdin.end(JSON.stringify(input));
    });
}
