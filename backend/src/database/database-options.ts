import type { DataSourceOptions } from 'typeorm';
import { MIGRATIONS } from './migrations';
import { ENTITIES } from './entities';

/**
 * One SQLite file through better-sqlite3: WAL so readers never wait for the writer,
 * a busy timeout so concurrent writers queue instead of failing, foreign keys on.
 * The schema comes from migrations only; `synchronize` stays off.
 */
export function sqliteOptions(databaseFile: string): DataSourceOptions {
  return {
    type: 'better-sqlite3',
    database: databaseFile,
    enableWAL: true,
    timeout: 5000,
    prepareDatabase: (db: { pragma(source: string): unknown }) => {
      db.pragma('foreign_keys = ON');
      db.pragma('synchronous = NORMAL');
    },
    entities: ENTITIES,
    migrations: MIGRATIONS,
    migrationsRun: true,
    migrationsTransactionMode: 'each',
    synchronize: false,
    logging: ['error'],
  };
}
