import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DataSource } from 'typeorm';
import { sqliteOptions } from './database-options';

/** A row of SQLite's `PRAGMA table_info` (sqlite.org/pragma.html#pragma_table_info). */
interface TableColumn {
  name: string;
  type: string;
  notnull: number;
  pk: number;
}

/**
 * The schema comes from the hand-written migrations only (synchronize is off), so an entity
 * that drifts from its table fails at run time, not at start. This builds a database from the
 * migrations and compares each entity's columns, base-class columns included, with its table.
 */
describe('entities and migrations', () => {
  let dir: string;
  let dataSource: DataSource;

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'gyre-schema-'));
    dataSource = new DataSource(sqliteOptions(join(dir, 'gyre.sqlite')));
    await dataSource.initialize();
  });

  afterAll(async () => {
    await dataSource.destroy();
    rmSync(dir, { recursive: true, force: true });
  });

  it('every entity column is a column of its table with the same type, null rule and key', async () => {
    expect(dataSource.entityMetadatas.length).toBeGreaterThan(20);
    const drift: string[] = [];
    for (const entity of dataSource.entityMetadatas) {
      const table = (await dataSource.query(
        `PRAGMA table_info("${entity.tableName}")`,
      )) as TableColumn[];
      // The declared type without its length: SQLite keeps `varchar(36)` as written.
      const fromTable = table
        .map((c) => describeColumn(c.name, c.type.replace(/\(.*/, ''), c.notnull === 0, c.pk > 0))
        .sort();
      const fromEntity = entity.columns
        .map((c) =>
          describeColumn(
            c.databaseName,
            String(dataSource.driver.normalizeType(c)),
            c.isNullable,
            c.isPrimary,
          ),
        )
        .sort();
      if (fromTable.join() !== fromEntity.join()) {
        drift.push(
          `${entity.tableName}: table ${fromTable.join(', ')}; entity ${fromEntity.join(', ')}`,
        );
      }
    }
    expect(drift).toEqual([]);
  });
});

function describeColumn(name: string, type: string, nullable: boolean, primary: boolean): string {
  return `${name} ${type.toLowerCase()}${nullable ? ' null' : ''}${primary ? ' key' : ''}`;
}
