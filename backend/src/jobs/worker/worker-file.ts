import { existsSync } from 'node:fs';
import { join } from 'node:path';

/**
 * The file piscina loads in each worker thread. From `dist/` the compiled
 * `analysis.worker.js` sits beside this file. Under jest this file is TypeScript and
 * nothing is compiled, so the threads start from `ts-worker.cjs`, which compiles the
 * worker's TypeScript with @swc/core as it is required. No build step is needed for
 * the tests, and the built server never depends on a dev tool.
 */
export function analysisWorkerFile(): string {
  const compiled = join(__dirname, 'analysis.worker.js');
  if (existsSync(compiled)) return compiled;
  const fromSource = join(__dirname, 'ts-worker.cjs');
  if (existsSync(fromSource) && existsSync(join(__dirname, 'analysis.worker.ts')))
    return fromSource;
  throw new Error(`No analysis worker found beside ${__dirname} (build the backend first)`);
}
