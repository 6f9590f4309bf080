import { existsSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
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
