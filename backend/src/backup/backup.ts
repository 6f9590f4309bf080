import { chmod, readdir, rename, stat, writeFile } from 'node:fs/promises';
import { closeSync, existsSync, fstatSync, openSync, readSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { ANCHOR_FILE_NAME } from '../audit/audit-anchor-file';
import { openSqliteFile, type SqliteFile } from '../audit/sqlite-file';
import { GYRE_VERSION } from '../version';
import {
  copyHashed,
  FILE_MODE,
  hashFile,
  ownerOnlyDir,
  relativeInside,
  walkTree,
} from './backup-files';
import { BackupManifest, DATABASE_FILE, MANIFEST_FILE, ManifestFile } from './backup-manifest';

export interface BackupOptions {
  /** The data folder of a running or stopped Gyre. */
  dataDir: string;
  /** Where the backup goes: created, or an empty folder; never inside the data folder. */
  outDir: string;
  /** Also copy `mail/` (the local capture server's messages; off by default). */
  includeMail?: boolean;
}

export interface BackupResult {
  outDir: string;
  manifest: BackupManifest;
}

/** A refusal or a failed check, with every reason in words. */
export class BackupError extends Error {
  constructor(
    readonly problems: string[],
    /** `refused`: nothing was written (bad input); `failed`: the copy itself went wrong. */
    readonly kind: 'refused' | 'failed' = 'refused',
  ) {
    super(problems.join('\n'));
    this.name = 'BackupError';
  }
}

/** Throws a `failed` BackupError naming `which` copy when SQLite finds `db` damaged. */
export function assertIntegrity(db: SqliteFile, which: string): void {
  const integrity = db.pragma('integrity_check', { simple: true });
  if (integrity !== 'ok') {
    throw new BackupError(
      [`${which} fails PRAGMA integrity_check: ${String(integrity)}`],
      'failed',
    );
  }
}

// The database is copied through SQLite, never as files; these are its live companions.
const DATABASE_COMPANIONS = new Set([
  DATABASE_FILE,
  `${DATABASE_FILE}-wal`,
  `${DATABASE_FILE}-shm`,
  `${DATABASE_FILE}-journal`,
]);

/**
 * A consistent copy of a data folder while Gyre may be writing to it:
 *
 * 1. the anchor file first, up to its last complete line, so that every checkpoint in the copy
 *    names an entry the database copy already holds;
 * 2. the database through SQLite's online backup API in a single step (one read transaction,
 *    so one committed state; see https://www.sqlite.org/backup.html), then checked with
 *    `PRAGMA integrity_check` and turned into a self-contained file (journal_mode DELETE);
 * 3. the stored files (uploads, reports, secrets, …) after it: they are written before the
 *    rows that name them commit and never change, so every file the copy names is there;
 * 4. `manifest.json` last, with the SHA-256 of every file: a folder without it is incomplete.
 */
export async function createBackup(options: BackupOptions): Promise<BackupResult> {
  const dataDir = resolve(options.dataDir);
  const outDir = resolve(options.outDir);
  const databaseFile = join(dataDir, DATABASE_FILE);
  await refuseBadTarget(dataDir, outDir, databaseFile);
  await ownerOnlyDir(outDir);

  const files: ManifestFile[] = [];
  const skipped: BackupManifest['skipped'] = [];

  const anchorSource = join(dataDir, ANCHOR_FILE_NAME);
  if (existsSync(anchorSource)) {
    const copied = await copyHashed(
      anchorSource,
      join(outDir, ANCHOR_FILE_NAME),
      completeLinesLength(anchorSource),
    );
    files.push({ path: ANCHOR_FILE_NAME, ...copied });
  }

  const database = await copyDatabase(databaseFile, join(outDir, DATABASE_FILE));
  files.push({ path: DATABASE_FILE, ...(await hashFile(join(outDir, DATABASE_FILE))) });

  for await (const entry of walkTree(dataDir)) {
    const top = entry.path.split('/')[0];
    if (entry.path === ANCHOR_FILE_NAME || DATABASE_COMPANIONS.has(entry.path)) continue;
    if (entry.path === 'uploads/tmp' || entry.path.startsWith('uploads/tmp/')) {
      if (entry.path === 'uploads/tmp') {
        skipped.push({
          path: 'uploads/tmp',
          why: 'unfinished uploads (Gyre clears them at start)',
        });
      }
      continue;
    }
    if (top === 'mail' && options.includeMail !== true) {
      if (entry.path === 'mail') {
        skipped.push({ path: 'mail', why: 'captured e-mail (add --include-mail to keep it)' });
      }
      continue;
    }
    if (entry.kind === 'dir') continue;
    if (entry.kind === 'other') {
      skipped.push({ path: entry.path, why: 'not a regular file (link, socket, …)' });
      continue;
    }
    try {
      const copied = await copyHashed(
        join(dataDir, ...entry.path.split('/')),
        join(outDir, ...entry.path.split('/')),
      );
      files.push({ path: entry.path, ...copied });
    } catch (error) {
      // Gone between listing and copying (a temporary file); nothing in the copy names it.
      if ((error as NodeJS.ErrnoException).code !== 'ENOENT') throw error;
      skipped.push({ path: entry.path, why: 'removed while the backup ran' });
    }
  }

  files.sort((a, b) => (a.path < b.path ? -1 : a.path > b.path ? 1 : 0));
  const manifest: BackupManifest = {
    format: 'gyre-backup',
    version: 1,
    createdAt: new Date().toISOString(),
    gyreVersion: GYRE_VERSION,
    source: dataDir,
    database: {
      file: DATABASE_FILE,
      method: 'sqlite-online-backup',
      integrityCheck: 'ok',
      auditHead: database.auditHead,
    },
    files,
    skipped,
  };
  const partial = join(outDir, `${MANIFEST_FILE}.partial`);
  await writeFile(partial, `${JSON.stringify(manifest, null, 2)}\n`, {
    mode: FILE_MODE,
    flag: 'wx',
  });
  await chmod(partial, FILE_MODE);
  await rename(partial, join(outDir, MANIFEST_FILE));
  return { outDir, manifest };
}

async function refuseBadTarget(dataDir: string, outDir: string, databaseFile: string) {
  const problems: string[] = [];
  if (!existsSync(databaseFile)) problems.push(`No Gyre database at ${databaseFile}`);
  if (relativeInside(dataDir, outDir) !== null || relativeInside(outDir, dataDir) !== null) {
    problems.push(`The backup folder ${outDir} must lie outside the data folder ${dataDir}`);
  }
  if (existsSync(outDir)) {
    if (!(await stat(outDir)).isDirectory()) problems.push(`${outDir} is not a folder`);
    else if ((await readdir(outDir)).length > 0) {
      problems.push(`${outDir} is not empty: a backup goes into a new or empty folder`);
    }
  }
  if (problems.length > 0) throw new BackupError(problems);
}

/** Bytes up to and including the last newline: a line still being appended is left out. */
function completeLinesLength(file: string): number {
  const fd = openSync(file, 'r');
  try {
    const buffer = Buffer.alloc(64 * 1024);
    for (let end = fstatSync(fd).size; end > 0;) {
      const start = Math.max(0, end - buffer.length);
      const read = readSync(fd, buffer, 0, end - start, start);
      const newline = buffer.subarray(0, read).lastIndexOf(0x0a);
      if (newline >= 0) return start + newline + 1;
      end = start;
    }
    return 0;
  } finally {
    closeSync(fd);
  }
}

async function copyDatabase(
  source: string,
  target: string,
): Promise<{ auditHead: BackupManifest['database']['auditHead'] }> {
  const live = openSqliteFile(source, { fileMustExist: true, timeout: 5000 });
  try {
    // better-sqlite3 copies 100 pages per event-loop turn and restarts when another connection
    // writes in between; asking for every page at once makes it one step, one snapshot.
    await live.backup(target, { progress: () => 0x7fffffff });
  } finally {
    live.close();
  }
  const copy = openSqliteFile(target, { fileMustExist: true });
  try {
    assertIntegrity(copy, 'The database copy');
    // One self-contained file, no -wal beside it; Gyre turns WAL on again when it opens it.
    copy.pragma('journal_mode = DELETE');
    const head = copy
      .prepare(`SELECT "seq", "hash" FROM "audit_entry" ORDER BY "seq" DESC LIMIT 1`)
      .get() as { seq: number; hash: string } | undefined;
    return { auditHead: head ?? null };
  } finally {
    copy.close();
    await chmod(target, FILE_MODE);
  }
}
