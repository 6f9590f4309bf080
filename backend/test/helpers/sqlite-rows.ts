import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import type { EntityManager } from 'typeorm';
import type { TestApp } from './test-app';

/**
 * Rows of `sql` read at once on the app's own better-sqlite3 connection (TypeORM's driver), so
 * nothing can run between a request's answer and the read.
 */
export function sqlRows<T>(t: TestApp, sql: string): T[] {
  const driver = t.dataSource.driver as unknown as {
    databaseConnection: { prepare(text: string): { all(): T[] } };
  };
  return driver.databaseConnection.prepare(sql).all();
}

/** How many rows each named table (or `table WHERE …`) holds now. */
export function rowCounts<Name extends string>(
  t: TestApp,
  tables: Record<Name, string>,
): Record<Name, number> {
  const counts = {} as Record<Name, number>;
  for (const name of Object.keys(tables) as Name[]) {
    counts[name] = sqlRows<{ n: number }>(t, `SELECT count(*) AS n FROM ${tables[name]}`)[0].n;
  }
  return counts;
}

/** The upload folder: the stored files (sorted) and what is left in its `tmp/` folder. */
export function uploadFolder(t: TestApp): { stored: string[]; temporary: string[] } {
  const dir = t.config.uploadsDir;
  const tmp = join(dir, 'tmp');
  return {
    stored: existsSync(dir)
      ? readdirSync(dir)
          .filter((name) => name !== 'tmp')
          .sort()
      : [],
    temporary: existsSync(tmp) ? readdirSync(tmp) : [],
  };
}

/** The id of the study's newest analysis settings version, or null before there is one. */
export async function newestSettingsId(t: TestApp, studyId: string): Promise<string | null> {
  const rows = (await t.dataSource.query(
    `SELECT "id" FROM "analysis_settings" WHERE "studyId" = ? ORDER BY "version" DESC LIMIT 1`,
    [studyId],
  )) as Array<{ id: string }>;
  return rows[0]?.id ?? null;
}

/**
 * Rows written straight into the database in one transaction with SQLite's foreign keys off
 * (for rows that name jobs or versions a test does not write), and on again after.
 */
export async function writeWithoutForeignKeys(
  t: TestApp,
  write: (tx: EntityManager) => Promise<void>,
): Promise<void> {
  await t.dataSource.query('PRAGMA foreign_keys = OFF');
  try {
    await t.dataSource.transaction(write);
  } finally {
    await t.dataSource.query('PRAGMA foreign_keys = ON');
  }
}

/** `table: text` for each table of the database whose rows hold one of `texts` anywhere. */
export async function tablesHolding(t: TestApp, texts: string[]): Promise<string[]> {
  const tables = (await t.dataSource.query(
    `SELECT "name" FROM "sqlite_master" WHERE "type" = 'table'`,
  )) as Array<{ name: string }>;
  const found: string[] = [];
  for (const { name } of tables) {
    const rows = JSON.stringify(await t.dataSource.query(`SELECT * FROM "${name}"`));
    for (const text of texts) if (rows.includes(text)) found.push(`${name}: ${text}`);
  }
  return found;
}

/**
 * Everything an import writes: the rows of recordings, visits, jobs and the audit entries of
 * someone's action (the computations' own moves have no actor), of the `more` tables named
 * like `rowCounts`' own, and the files in the upload folder.
 */
export function importFootprint<Name extends string>(t: TestApp, more: Record<Name, string>) {
  return {
    ...rowCounts(t, {
      recordings: 'recording',
      visits: 'visit',
      jobs: 'job',
      audit: 'audit_entry WHERE actorId IS NOT NULL',
      ...more,
    }),
    ...uploadFolder(t),
  };
}
