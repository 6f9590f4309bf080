import { chmodSync, existsSync, lstatSync, mkdirSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { isMainThread } from 'node:worker_threads';

/** Group and other get no bits on anything Gyre creates (OWASP ASVS 4.0 8.1.2, 12.4.1). */
export const PRIVATE_UMASK = 0o077;

/**
 * What Gyre itself keeps in DATA_DIR. Only these are tightened at start, so a DATA_DIR that
 * also holds other things (even a home folder) is not rewritten wholesale.
 */
export const GYRE_DATA_ENTRIES = [
  'gyre.sqlite',
  'gyre.sqlite-wal',
  'gyre.sqlite-shm',
  'gyre.sqlite-journal',
  'secrets',
  'uploads',
  'mail',
  'reports',
  'demo-accounts.txt',
  // audit/audit-anchor-file.ts ANCHOR_FILE_NAME (named here so config does not depend on audit).
  'audit-anchors.jsonl',
] as const;

/** Makes every file and folder the process creates from now on private to its owner. */
export function restrictUmask(): void {
  // Worker threads cannot change the umask; the main thread's applies to them.
  if (!isMainThread) return;
  const previous = process.umask(PRIVATE_UMASK);
  process.umask(previous | PRIVATE_UMASK);
}

/**
 * Creates DATA_DIR (mode 700) and takes group and other bits off it and off Gyre's own
 * entries in it, recursively: folders become 700, files 600 (a read-only file 400).
 */
export function makeDataDirPrivate(dataDir: string): void {
  restrictUmask();
  mkdirSync(dataDir, { recursive: true, mode: 0o700 });
  // DATA_DIR and Gyre's entries may be links the operator placed (say, to a larger disk).
  tighten(dataDir, true);
  const pending = GYRE_DATA_ENTRIES.map((name) => join(dataDir, name))
    .filter((path) => existsSync(path))
    .filter((path) => tighten(path, true));
  while (pending.length > 0) {
    const folder = pending.pop() as string;
    for (const name of readdirSync(folder)) {
      const path = join(folder, name);
      // Links further in are not Gyre's making: chmod would change whatever they point at.
      if (tighten(path, false)) pending.push(path);
    }
  }
}

/** Clears group/other bits of one path; true when it is a folder to descend into. */
function tighten(path: string, followLink: boolean): boolean {
  const stats = followLink ? statSync(path) : lstatSync(path);
  if (stats.isSymbolicLink()) return false;
  if ((stats.mode & PRIVATE_UMASK) !== 0) chmodSync(path, stats.mode & 0o700);
  return stats.isDirectory();
}
