import type { Driver, EntityMetadata } from 'typeorm';
import type { PageWindow } from '../pagination/page-query.dto';
import type { SqliteReadsService, SqlValue } from './sqlite-reads.service';

/**
 * Entity rows read by prepared statements (`SqliteReadsService`) on hot list routes, as TypeORM
 * would have read them: every column the entity maps, converted by the driver's own rules
 * (`prepareHydratedValue`), so a column added to the entity is read here too.
 */
export class SqlEntityRows<T> {
  /** `alias."column" AS "property", …` for every mapped column. */
  readonly columns: string;

  constructor(
    private readonly metadata: EntityMetadata,
    private readonly driver: Driver,
    alias: string,
  ) {
    this.columns = metadata.columns
      .map((c) => `${alias}."${c.databaseName}" AS "${c.propertyName}"`)
      .join(', ');
  }

  hydrate(raw: Record<string, unknown>): T {
    const row: Record<string, unknown> = {};
    for (const column of this.metadata.columns) {
      row[column.propertyName] = this.driver.prepareHydratedValue(raw[column.propertyName], column);
    }
    return row as T;
  }
}

export interface SqlPageQuery {
  /** The SELECT list. */
  columns: string;
  /** `"table" alias` and any joins. */
  from: string;
  /** Conditions AND-ed together (at least the caller's scope). */
  where: readonly string[];
  params: readonly SqlValue[];
  /** A total order (end with the primary key), so pages never overlap. */
  orderBy: string;
}

/**
 * One page of rows and how many rows match in all: the page, then a count only when the page
 * does not tell (a full page, or one past the end). Both are prepared statements run in the
 * same synchronous step. (`COUNT(*) OVER ()` in the page's own statement made SQLite
 * materialise and sort a subquery: ten times the time of the two statements.)
 */
export function sqlPage(
  reads: SqliteReadsService,
  query: SqlPageQuery,
  window: PageWindow,
): [Record<string, unknown>[], number] {
  const where = query.where.length === 0 ? '1' : query.where.map((w) => `(${w})`).join(' AND ');
  const rows = reads.all<Record<string, unknown>>(
    `SELECT ${query.columns} FROM ${query.from}
      WHERE ${where} ORDER BY ${query.orderBy} LIMIT ? OFFSET ?`,
    [...query.params, window.take, window.skip],
  );
  if (rows.length < window.take && (rows.length > 0 || window.skip === 0)) {
    return [rows, window.skip + rows.length];
  }
  const counted = reads.one<{ total: number }>(
    `SELECT COUNT(*) AS "total" FROM ${query.from} WHERE ${where}`,
    query.params,
  );
  return [rows, counted?.total ?? 0];
}
