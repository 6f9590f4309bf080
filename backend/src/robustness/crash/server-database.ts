import { join } from 'node:path';
import { DataSource } from 'typeorm';
import { sqliteOptions } from '../../database/database-options';

/**
 * The database of a server started on `dataDir` (server-process.ts), opened beside it to seed
 * and check: the server has run the migrations, so this connection does not. Close it with
 * `destroy()`.
 */
export async function openServerDatabase(dataDir: string): Promise<DataSource> {
  const dataSource = new DataSource({
    ...sqliteOptions(join(dataDir, 'gyre.sqlite')),
    migrationsRun: false,
  });
  await dataSource.initialize();
  return dataSource;
}
