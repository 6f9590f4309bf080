import { createRequire } from 'node:module';

/** The better-sqlite3 statement calls Gyre makes on its own connections. */
export interface SqliteStatement {
  get(...params: unknown[]): unknown;
  all(...params: unknown[]): unknown[];
  iterate(...params: unknown[]): IterableIterator<unknown>;
  run(...params: unknown[]): { changes: number };
}

export interface BackupProgress {
  totalPages: number;
  remainingPages: number;
}

/** A better-sqlite3 `Database`, reduced to what the audit anchors and the backup use. */
export interface SqliteFile {
  prepare(sql: string): SqliteStatement;
  exec(sql: string): void;
  pragma(source: string, options?: { simple?: boolean }): unknown;
  backup(
    destination: string,
    options?: { progress?: (progress: BackupProgress) => number | undefined },
  ): Promise<BackupProgress>;
  close(): void;
  readonly open: boolean;
}

export interface OpenSqliteOptions {
  readonly?: boolean;
  fileMustExist?: boolean;
  /** Busy timeout in milliseconds (0: fail at once with SQLITE_BUSY). */
  timeout?: number;
}

type SqliteConstructor = new (file: string, options?: OpenSqliteOptions) => SqliteFile;

// better-sqlite3 ships no types; loading it through createRequire keeps one typed entry point.
const load = createRequire(__filename);

/** Opens a second, independent connection to a SQLite file (not TypeORM's). */
export function openSqliteFile(file: string, options: OpenSqliteOptions = {}): SqliteFile {
  const Database = load('better-sqlite3') as SqliteConstructor;
  return new Database(file, options);
}

/** SQLITE_BUSY and SQLITE_LOCKED: another connection holds the lock; try again later. */
export function isBusyError(error: unknown): boolean {
  const code =
    typeof error === 'object' && error !== null && 'code' in error ? String(error.code) : '';
  return code.startsWith('SQLITE_BUSY') || code.startsWith('SQLITE_LOCKED');
}
