import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import { sqliteHandleOf, type SqliteHandle } from './sqlite-handle';

/** What SQLite binds: better-sqlite3 refuses booleans and undefined (pass 1/0 and null). */
export type SqlValue = string | number | bigint | Buffer | null;

type Statement = ReturnType<SqliteHandle['prepare']>;

/** Distinct statements kept prepared; Gyre's hot reads are a few dozen. */
const MAX_STATEMENTS = 256;

/**
 * Reads on the hot paths (every request's session check, the results routes' scope checks),
 * as prepared better-sqlite3 statements on TypeORM's own connection: the same database, the
 * same transaction state, none of the query builder's cost (about 0.1–0.2 ms of CPU per query
 * under load, most of a light request's). Reads only: writes go through WriteTransactionsService.
 * Every row is read when asked, never kept, so nothing here can be stale.
 */
@Injectable()
export class SqliteReadsService {
  private readonly statements = new Map<string, Statement>();
  /** The connection the statements belong to (a reconnected data source has another). */
  private handle: SqliteHandle | null = null;

  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  /** The first row, or null. Column names as the SQL names them (quote camelCase columns). */
  one<T>(sql: string, params: readonly SqlValue[] = []): T | null {
    return (this.statement(sql).get(...params) as T | undefined) ?? null;
  }

  all<T>(sql: string, params: readonly SqlValue[] = []): T[] {
    return this.statement(sql).all(...params) as T[];
  }

  private statement(sql: string): Statement {
    const handle = sqliteHandleOf(this.dataSource);
    if (handle !== this.handle) {
      this.statements.clear();
      this.handle = handle;
    }
    let found = this.statements.get(sql);
    if (found === undefined) {
      // Statements built from a scope differ by their rules' shape only, so few distinct
      // texts arise; should that ever grow, start again rather than grow without bound.
      if (this.statements.size >= MAX_STATEMENTS) this.statements.clear();
      found = handle.prepare(sql);
      this.statements.set(sql, found);
    }
    return found;
  }
}
