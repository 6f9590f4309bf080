import { isSafeRelativePath } from './backup-files';

export const MANIFEST_FILE = 'manifest.json';
export const DATABASE_FILE = 'gyre.sqlite';

/** `manifest.json` of a backup folder: what it holds, and the SHA-256 of every file. */
export interface BackupManifest {
  format: 'gyre-backup';
  version: 1;
  createdAt: string;
  gyreVersion: string;
  /** The data folder the backup was taken from (absolute). */
  source: string;
  database: {
    file: typeof DATABASE_FILE;
    /** How the copy was taken: SQLite's online backup API, in one step. */
    method: 'sqlite-online-backup';
    /** `PRAGMA integrity_check` of the copy. */
    integrityCheck: 'ok';
    /** The newest audit entry in the copy (null: an empty trail). */
    auditHead: { seq: number; hash: string } | null;
  };
  /** Every file of the backup but this manifest, sorted by path. */
  files: ManifestFile[];
  /** What was left out of the data folder, and why. */
  skipped: { path: string; why: string }[];
}

export interface ManifestFile {
  /** Relative to the backup folder (and to the data folder it restores into), `/`-separated. */
  path: string;
  bytes: number;
  sha256: string;
}

/** Checks the manifest's shape; every problem in words, nothing trusted before it passes. */
export function parseManifest(text: string): { manifest: BackupManifest } | { problems: string[] } {
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    return { problems: [`${MANIFEST_FILE} is not JSON`] };
  }
  const record = (typeof value === 'object' && value !== null ? value : {}) as Record<
    string,
    unknown
  >;
  const problems: string[] = [];
  if (record.format !== 'gyre-backup' || record.version !== 1) {
    problems.push(
      `${MANIFEST_FILE}: format "${String(record.format)}" version ${String(record.version)} found, "gyre-backup" version 1 expected`,
    );
  }
  if (!Array.isArray(record.files)) {
    problems.push(`${MANIFEST_FILE}: no list of files`);
    return { problems };
  }
  const seen = new Set<string>();
  for (const [i, entry] of (record.files as unknown[]).entries()) {
    const file = (typeof entry === 'object' && entry !== null ? entry : {}) as Record<
      string,
      unknown
    >;
    const path = typeof file.path === 'string' ? file.path : '';
    if (!isSafeRelativePath(path) || path === MANIFEST_FILE) {
      problems.push(`${MANIFEST_FILE}: file ${i + 1} has an unsafe or missing path "${path}"`);
    } else if (seen.has(path)) {
      problems.push(`${MANIFEST_FILE}: ${path} is listed twice`);
    }
    seen.add(path);
    if (!Number.isSafeInteger(file.bytes) || (file.bytes as number) < 0) {
      problems.push(`${MANIFEST_FILE}: ${path}: bytes missing or not a whole number`);
    }
    if (typeof file.sha256 !== 'string' || !/^[0-9a-f]{64}$/.test(file.sha256)) {
      problems.push(`${MANIFEST_FILE}: ${path}: sha256 missing or not 64 hex digits`);
    }
  }
  if (!seen.has(DATABASE_FILE)) problems.push(`${MANIFEST_FILE}: ${DATABASE_FILE} is not listed`);
  return problems.length > 0 ? { problems } : { manifest: record as unknown as BackupManifest };
}
