import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

/** A fresh temporary folder for the files a spec writes; `remove` it in `afterAll`. */
interface ScratchFolder {
  dir: string;
  /** Writes `bytes` to `name` in the folder; the file's path. */
  write: (name: string, bytes: Uint8Array) => string;
  remove: () => void;
}

export function scratchFolder(prefix: string): ScratchFolder {
  const dir = mkdtempSync(join(tmpdir(), prefix));
  return {
    dir,
    write: (name, bytes) => {
      const path = join(dir, name);
      writeFileSync(path, bytes);
      return path;
    },
    remove: () => rmSync(dir, { recursive: true, force: true }),
  };
}
