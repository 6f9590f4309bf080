import { existsSync } from 'node:fs';
import { mkdir, mkdtemp, readdir, readFile, rename, rm, rmdir, stat } from 'node:fs/promises';
import { basename, dirname, join, resolve } from 'node:path';
import type { AuditVerifyResult } from '@gyre/shared';
import { verifyDataDir } from '../audit/audit-verify';
import { openSqliteFile } from '../audit/sqlite-file';
import { assertIntegrity, BackupError } from './backup';
import { copyHashed, hashFile, ownerOnlyDir, walkTree } from './backup-files';
import {
  BackupManifest,
  DATABASE_FILE,
  MANIFEST_FILE,
  ManifestFile,
  parseManifest,
} from './backup-manifest';

/**
 * Checks a backup folder against its manifest: every listed file present with its size and
 * SHA-256, nothing unlisted beside them. Throws BackupError with every problem found.
 */
export async function verifyBackup(backupDir: string): Promise<BackupManifest> {
  const folder = resolve(backupDir);
  const manifestFile = join(folder, MANIFEST_FILE);
  if (!existsSync(manifestFile)) {
    throw new BackupError([
      `${folder} has no ${MANIFEST_FILE}: not a Gyre backup, or one that did not finish`,
    ]);
  }
  const parsed = parseManifest(await readFile(manifestFile, 'utf8'));
  if ('problems' in parsed) throw new BackupError(parsed.problems);
  const { manifest } = parsed;
  const listed = new Map(manifest.files.map((file) => [file.path, file]));
  const problems: string[] = [];
  const present = new Set<string>();
  for await (const entry of walkTree(folder)) {
    if (entry.kind === 'dir' || entry.path === MANIFEST_FILE) continue;
    if (entry.kind === 'other') {
      problems.push(`${entry.path} is not a regular file (link, socket, …)`);
    } else if (!listed.has(entry.path)) {
      problems.push(`${entry.path} is in the folder but not in the manifest`);
    }
    present.add(entry.path);
  }
  for (const file of manifest.files) {
    if (!present.has(file.path)) {
      problems.push(`${file.path} is listed in the manifest but missing`);
      continue;
    }
    const found = await hashFile(join(folder, ...file.path.split('/')));
    if (found.bytes !== file.bytes || found.sha256 !== file.sha256) {
      problems.push(
        `${file.path} does not match the manifest: ${found.bytes} bytes, SHA-256 ${found.sha256} found; ${file.bytes} bytes, SHA-256 ${file.sha256} expected`,
      );
    }
  }
  if (problems.length > 0) throw new BackupError(problems);
  return manifest;
}

export interface RestoreOptions {
  backupDir: string;
  /** A new or empty folder; a folder with anything in it is refused. */
  dataDir: string;
}

export interface RestoreResult {
  dataDir: string;
  manifest: BackupManifest;
  /** The restored audit trail, checked as `GET /api/audit/verify` checks it. */
  audit: AuditVerifyResult;
}

/**
 * Verifies the backup, copies it into a temporary folder beside the target (hashing every file
 * again as it is copied), checks the database, then renames the folder into place: the target
 * is either untouched or complete.
 */
export async function restoreBackup(options: RestoreOptions): Promise<RestoreResult> {
  const backupDir = resolve(options.backupDir);
  const dataDir = resolve(options.dataDir);
  await refuseNonEmpty(dataDir);
  const manifest = await verifyBackup(backupDir);
  await mkdir(dirname(dataDir), { recursive: true });
  const staging = await mkdtemp(join(dirname(dataDir), `.${basename(dataDir)}.restoring-`));
  try {
    await ownerOnlyDir(staging);
    for (const file of manifest.files) await copyChecked(backupDir, staging, file);
    const databaseFile = join(staging, DATABASE_FILE);
    const db = openSqliteFile(databaseFile, { fileMustExist: true });
    try {
      assertIntegrity(db, 'The restored database');
    } finally {
      db.close();
    }
    const audit = await verifyDataDir(staging, databaseFile);
    await refuseNonEmpty(dataDir);
    if (existsSync(dataDir)) await rmdir(dataDir);
    await rename(staging, dataDir);
    return { dataDir, manifest, audit };
  } catch (error) {
    await rm(staging, { recursive: true, force: true });
    throw error;
  }
}

async function copyChecked(backupDir: string, staging: string, file: ManifestFile) {
  const parts = file.path.split('/');
  const copied = await copyHashed(join(backupDir, ...parts), join(staging, ...parts));
  // Checked again while copying: the backup could have changed since it was verified.
  if (copied.bytes !== file.bytes || copied.sha256 !== file.sha256) {
    throw new BackupError([`${file.path} changed while it was restored`], 'failed');
  }
  for (let i = 1; i < parts.length; i += 1) {
    await ownerOnlyDir(join(staging, ...parts.slice(0, i)));
  }
}

async function refuseNonEmpty(dataDir: string): Promise<void> {
  if (!existsSync(dataDir)) return;
  if (!(await stat(dataDir)).isDirectory()) {
    throw new BackupError([`${dataDir} exists and is not a folder`]);
  }
  const entries = await readdir(dataDir);
  if (entries.length > 0) {
    throw new BackupError([
      `${dataDir} is not empty (${entries.length} entries): restore only into a new or empty folder, so that nothing is overwritten or mixed`,
    ]);
  }
}
