import { Injectable } from '@nestjs/common';
import type { DeepPartial, EntityManager, EntityTarget, ObjectLiteral } from 'typeorm';
import type { Caller } from '../auth/decorators';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { isUniqueViolation } from '../common/errors/unique-violation';
import { AuditService } from './audit.service';

/** Who may read an entry: the study and site the written row belongs to. */
export interface AuditScope {
  studyId: string | null;
  siteId: string | null;
}

interface AuditedRow<Row> {
  entity: EntityTarget<Row>;
  /** The CASL subject name the entry names (`Participant`, `Visit`, …). */
  objectType: string;
  scope: (row: Row) => AuditScope;
  reason?: string | null;
}

export interface AuditedSave<Row, View> extends AuditedRow<Row> {
  /** The row as it was; null for a new one (the entry's action is then `create`). */
  before: Row | null;
  /** The row to write, or how to build it inside the transaction (when it needs a read). */
  row: Row | ((manager: EntityManager) => Promise<Row>);
  /** Checks inside the transaction before the write; a uniqueness check throws DuplicateRowError. */
  check: (manager: EntityManager, row: Row) => Promise<void>;
  view: (row: Row) => View;
  /** The earlier row's view when it needs reads; `view` otherwise. */
  beforeView?: (row: Row, manager: EntityManager) => Promise<View>;
  /** The module's 409 when the row clashes with a unique index. */
  duplicate: (row: Row) => Error;
}

export interface AuditedInsert<Row> extends AuditedRow<Row> {
  row: Row;
  view: (row: Row) => unknown;
}

export interface AuditedRemoval<Row> extends AuditedRow<Row> {
  row: Row;
  view: (row: Row) => unknown;
  /** Refuses inside the transaction (a 409 naming what still uses the row). */
  check: (manager: EntityManager) => Promise<void>;
}

/**
 * A study-model row and the audit entry that describes its change, written in one write
 * transaction: both commit or neither does.
 */
@Injectable()
export class AuditedWrites {
  constructor(
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
  ) {}

  /** Creates (`before` null) or updates the row and returns its view. */
  async save<Row extends ObjectLiteral & { id: string }, View>(
    caller: Caller,
    spec: AuditedSave<Row, View>,
  ): Promise<View> {
    let built: Row | undefined;
    try {
      return await this.writes.run(async (manager) => {
        const row = typeof spec.row === 'function' ? await spec.row(manager) : spec.row;
        built = row;
        await spec.check(manager, row);
        await manager.save(spec.entity, row as DeepPartial<Row>);
        const view = spec.view(row);
        const before =
          spec.before === null
            ? undefined
            : spec.beforeView === undefined
              ? spec.view(spec.before)
              : await spec.beforeView(spec.before, manager);
        await this.entry(caller, spec, row, spec.before === null ? 'create' : 'update', {
          before,
          after: view,
        });
        return view;
      });
    } catch (error) {
      if (built !== undefined && isUniqueViolation(error)) throw spec.duplicate(built);
      throw error;
    }
  }

  /**
   * Inside a transaction the caller already holds (an import writing many rows at once):
   * inserts a new row and its `create` entry, the entry its module's own create writes.
   */
  async insertIn<Row extends ObjectLiteral & { id: string }>(
    manager: EntityManager,
    caller: Caller,
    spec: AuditedInsert<Row>,
  ): Promise<void> {
    await manager.insert(spec.entity, spec.row as DeepPartial<Row>);
    await this.entry(caller, spec, spec.row, 'create', { after: spec.view(spec.row) });
  }

  /** Deletes the row once `check` lets it go. */
  async remove<Row extends ObjectLiteral & { id: string }>(
    caller: Caller,
    spec: AuditedRemoval<Row>,
  ): Promise<void> {
    await this.writes.run(async (manager) => {
      await spec.check(manager);
      await manager.delete(spec.entity, { id: spec.row.id });
      await this.entry(caller, spec, spec.row, 'delete', { before: spec.view(spec.row) });
    });
  }

  /** The entry of one row's change: the caller, the row's scope and the spec's reason. */
  private async entry<Row extends { id: string }>(
    caller: Caller,
    spec: AuditedRow<Row>,
    row: Row,
    action: 'create' | 'update' | 'delete',
    change: { before?: unknown; after?: unknown },
  ): Promise<void> {
    await this.audit.record({
      actor: caller.user,
      action,
      objectType: spec.objectType,
      objectId: row.id,
      ...spec.scope(row),
      ...change,
      reason: spec.reason ?? null,
      clientIp: caller.clientIp,
    });
  }
}
