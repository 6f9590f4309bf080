import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DataSource } from 'typeorm';
import { sqliteOptions } from '../../src/database/database-options';
import { MIGRATIONS } from '../../src/database/migrations';

/**
 * A database in a temp folder as the version before `migration` wrote it (every earlier
 * migration applied), for a migration test to fill with old rows and then migrate.
 */
export class MigrationDatabase {
  private constructor(
    readonly dataSource: DataSource,
    /** The migration's place in MIGRATIONS. */
    readonly index: number,
    private readonly folder: string,
  ) {}

  static async before(migration: (typeof MIGRATIONS)[number]): Promise<MigrationDatabase> {
    const folder = mkdtempSync(join(tmpdir(), 'gyre-migration-'));
    const index = MIGRATIONS.indexOf(migration);
    const dataSource = new DataSource({
      ...sqliteOptions(join(folder, 'gyre.sqlite')),
      migrations: MIGRATIONS.slice(0, index),
      migrationsRun: false,
    });
    await dataSource.initialize();
    await dataSource.runMigrations({ transaction: 'each' });
    return new MigrationDatabase(dataSource, index, folder);
  }

  query(sql: string, params: unknown[] = []): Promise<unknown> {
    return this.dataSource.query(sql, params);
  }

  /**
   * Reopens the database with the first `count` migrations (default all) and applies the
   * pending ones; says whether any were pending.
   */
  async migrate(count = MIGRATIONS.length): Promise<boolean> {
    this.dataSource.setOptions({ migrations: MIGRATIONS.slice(0, count) });
    await this.dataSource.destroy();
    await this.dataSource.initialize();
    const pending = await this.dataSource.showMigrations();
    await this.dataSource.runMigrations({ transaction: 'each' });
    return pending;
  }

  async close(): Promise<void> {
    await this.dataSource.destroy();
    rmSync(this.folder, { recursive: true, force: true });
  }
}
