import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource, EntityManager } from 'typeorm';

/**
 * Runs write transactions one after another. TypeORM's better-sqlite3 driver has a single
 * connection, so two overlapping `dataSource.transaction()` calls would silently nest as
 * savepoints of one another; SQLite has one writer anyway, so queueing costs nothing.
 */
@Injectable()
export class WriteTransactionsService {
  private tail: Promise<unknown> = Promise.resolve();

  constructor(@InjectDataSource() private readonly dataSource: DataSource) {}

  run<T>(work: (manager: EntityManager) => Promise<T>): Promise<T> {
    const result = this.tail.then(() => this.dataSource.transaction(work));
    // The queue must go on after a failed transaction; the caller still sees the failure.
    this.tail = result.catch(() => undefined);
    return result;
  }
}
