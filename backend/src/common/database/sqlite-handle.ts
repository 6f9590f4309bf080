import { DataSource } from 'typeorm';

/** The few better-sqlite3 calls Gyre makes below TypeORM (synchronous, hence atomic in-process). */
export interface SqliteHandle {
  prepare(sql: string): {
    get(...params: unknown[]): unknown;
    all(...params: unknown[]): unknown[];
    run(...params: unknown[]): { changes: number };
  };
  transaction<A extends unknown[], R>(
    fn: (...args: A) => R,
  ): ((...args: A) => R) & { immediate: (...args: A) => R };
  readonly inTransaction: boolean;
}

/** The better-sqlite3 `Database` under a TypeORM data source. */
export function sqliteHandleOf(dataSource: DataSource): SqliteHandle {
  const driver: unknown = dataSource.driver;
  const connection =
    typeof driver === 'object' && driver !== null && 'databaseConnection' in driver
      ? driver.databaseConnection
      : undefined;
  if (typeof connection !== 'object' || connection === null || !('prepare' in connection)) {
    throw new Error('The data source is not connected through better-sqlite3');
  }
  return connection as SqliteHandle;
}
