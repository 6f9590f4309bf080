/**
 * Runs `scipy_reference.py` (numpy/scipy, Debian python3-scipy) on generated data: the
 * reference the generator's tests compare against.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

const SCRIPT = join(__dirname, 'scipy_reference.py');

export function scipyReference<T>(request: Record<string, unknown>): T {
  const out = execFileSync('python3', [SCRIPT], {
    input: JSON.stringify(request),
    maxBuffer: 64 * 1024 * 1024,
    // Python's error goes into the thrown message (tests match it), not onto the test log.
    stdio: ['pipe', 'pipe', 'pipe'],
  });
  return JSON.parse(out.toString()) as T;
}

/** A temporary folder for files handed to python, removed by `dispose`. */
export class ScratchFolder {
  readonly path = mkdtempSync(join(tmpdir(), 'gyre-seed-test-'));

  write(name: string, data: Uint8Array | Float64Array | string): string {
    const file = join(this.path, name);
    writeFileSync(
      file,
      typeof data === 'string'
        ? data
        : new Uint8Array(data.buffer, data.byteOffset, data.byteLength),
    );
    return file;
  }

  dispose(): void {
    rmSync(this.path, { recursive: true, force: true });
  }
}
