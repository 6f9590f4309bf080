import { InjectRepository } from '@nestjs/typeorm';
import type {
  EntityManager,
  FindOptionsOrder,
  FindOptionsWhere,
  ObjectLiteral,
  Repository,
} from 'typeorm';
import { subject } from '@gyre/shared';
import { AuditedWrites, type AuditScope } from '../audit/audited-writes';
import { scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import type { GyreException } from '../common/errors/gyre.exception';
import { OwnedRows } from '../common/database/owned-rows';
import { givenFields } from '../common/given-fields';
import { nowIso } from '../common/time';
import { DuplicateRowError } from '../common/errors/unique-violation';
import { StudiesService } from '../studies/studies.service';
import { StudiesError, studiesError } from '../studies/studies.errors';

/** A row of a study's schedule: it belongs to the study (no site) and has a name unique in it. */
type StudyRow = ObjectLiteral & { id: string; studyId: string; name: string; updatedAt: string };

/** Participant codes that still use a row: how many, the first five, and those as a phrase. */
interface CodesInUse {
  count: number;
  named: string[];
  listed: string;
}

/** What tells one kind of schedule row (planned visits, groups) from the other. */
export interface StudyRowKind<Row extends StudyRow, View> {
  entity: new () => Row;
  subject: 'PlannedVisit' | 'StudyGroup';
  table: 'planned_visit' | 'study_group';
  /** The part of the study these rows are, for the 404 ("… whose schedule you may change"). */
  part: string;
  /** The order `list` returns. */
  order: FindOptionsOrder<Row>;
  view: (row: Row) => View;
  notFound: (studyId: string, id: string) => GyreException;
  /** The 409 when the study has a row of that name already. */
  nameTaken: (row: Row) => GyreException;
  /** SQL selecting the `code` of each participant that still uses a row (one `?`: its id). */
  usersSql: string;
  /** The 409 naming those participants. */
  inUse: (row: Row, users: CodesInUse) => GyreException;
}

/** The audit scope of a schedule row: its study, no site. */
const studyRowScope = (row: { studyId: string }): AuditScope => ({
  studyId: row.studyId,
  siteId: null,
});

/**
 * The scoped reads and audited writes both kinds of schedule row share; each service extends
 * it and builds its own rows from its DTOs.
 */
export abstract class StudyRowsService<Row extends StudyRow, View> extends OwnedRows<Row> {
  protected constructor(
    rows: Repository<Row>,
    private readonly studies: StudiesService,
    private readonly audited: AuditedWrites,
    private readonly kind: StudyRowKind<Row, View>,
  ) {
    super(rows);
  }

  /** The study's rows the caller may read, in the kind's order. */
  async list(caller: Caller, studyId: string): Promise<View[]> {
    await this.studies.findInScope(caller, 'read', studyId);
    const rows = await this.repository.find({
      where: scopedWhere<Row>(caller.ability, 'read', this.kind.subject, {
        studyId,
      } as FindOptionsWhere<Row>),
      order: this.kind.order,
    });
    return rows.map(this.kind.view);
  }

  /** Creates the row `build` makes (inside the write transaction), audited. */
  protected async createRow(
    caller: Caller,
    studyId: string,
    build: (manager: EntityManager) => Promise<Row>,
  ): Promise<View> {
    await this.assertWritable(caller, 'create', studyId);
    return this.save(caller, null, build);
  }

  /** Changes the fields `changes` gives (a PATCH body) of row `id`, audited. */
  async update(
    caller: Caller,
    studyId: string,
    id: string,
    changes: Partial<Omit<Row, 'id' | 'studyId' | 'createdAt' | 'updatedAt'>>,
  ): Promise<View> {
    await this.assertWritable(caller, 'update', studyId);
    const current = await this.find(caller, 'update', studyId, id);
    return this.save(caller, current, { ...current, ...givenFields(changes), updatedAt: nowIso() });
  }

  /** Deletes the row with its audit entry, unless a participant still uses it (409). */
  async remove(
    caller: Caller,
    studyId: string,
    id: string,
    reason: string | undefined,
  ): Promise<void> {
    await this.assertWritable(caller, 'delete', studyId);
    const row = await this.find(caller, 'delete', studyId, id);
    await this.audited.remove(caller, {
      entity: this.kind.entity,
      objectType: this.kind.subject,
      row,
      reason,
      scope: studyRowScope,
      view: this.kind.view,
      check: async (manager) => {
        const users = await codesInUse(manager, this.kind.usersSql, id);
        if (users.count > 0) throw this.kind.inUse(row, users);
      },
    });
  }

  /** 404 unless the caller reads study `studyId` and may `action` its rows of this kind. */
  private async assertWritable(
    caller: Caller,
    action: 'create' | 'update' | 'delete',
    studyId: string,
  ): Promise<void> {
    await this.studies.findInScope(caller, 'read', studyId);
    if (!caller.ability.can(action, subject(this.kind.subject, { studyId }))) {
      throw studiesError(
        StudiesError.NotFound,
        `No study ${studyId} whose ${this.kind.part} you may change`,
        { id: studyId },
      );
    }
  }

  /** The row `id` of study `studyId` in the caller's scope for `action`, else the kind's 404. */
  private async find(
    caller: Caller,
    action: 'read' | 'update' | 'delete',
    studyId: string,
    id: string,
  ): Promise<Row> {
    const row = await this.repository.findOne({
      where: scopedWhere<Row>(caller.ability, action, this.kind.subject, {
        id,
        studyId,
      } as FindOptionsWhere<Row>),
    });
    if (row === null) throw this.kind.notFound(studyId, id);
    return row;
  }

  /** Creates (`before` null) or updates the row, audited; 409 when its name is taken. */
  private save(
    caller: Caller,
    before: Row | null,
    row: Row | ((manager: EntityManager) => Promise<Row>),
  ): Promise<View> {
    return this.audited.save(caller, {
      entity: this.kind.entity,
      objectType: this.kind.subject,
      before,
      row,
      scope: studyRowScope,
      check: (manager, built) => this.assertNameFree(manager, built),
      view: this.kind.view,
      duplicate: this.kind.nameTaken,
    });
  }

  /**
   * Names are unique per study without regard to case (the index uses NOCASE); looking first
   * turns the usual duplicate into a clean 409 (the index stays the backstop).
   */
  private async assertNameFree(manager: EntityManager, row: Row): Promise<void> {
    const rows = (await manager.query(
      `SELECT 1 FROM "${this.kind.table}" WHERE "studyId" = ? AND "name" = ? COLLATE NOCASE AND "id" <> ? LIMIT 1`,
      [row.studyId, row.name, row.id],
    )) as unknown[];
    if (rows.length > 0) throw new DuplicateRowError('duplicate');
  }
}

/**
 * The base class of one kind's service, its repository injected (a mixin, like NestJS's
 * mapped types): the service itself only builds its rows from its DTOs.
 */
export function StudyRowsServiceFor<Row extends StudyRow, View>(
  kind: StudyRowKind<Row, View>,
): abstract new (
  rows: Repository<Row>,
  studies: StudiesService,
  audited: AuditedWrites,
) => StudyRowsService<Row, View> {
  abstract class StudyRowsOfKind extends StudyRowsService<Row, View> {
    constructor(
      @InjectRepository(kind.entity) rows: Repository<Row>,
      studies: StudiesService,
      audited: AuditedWrites,
    ) {
      super(rows, studies, audited, kind);
    }
  }
  return StudyRowsOfKind;
}

/** The participant codes an SQL query names, ordered; with the first five for a message. */
async function codesInUse(manager: EntityManager, sql: string, id: string): Promise<CodesInUse> {
  const codes = ((await manager.query(sql, [id])) as { code: string }[]).map((r) => r.code);
  const named = codes.slice(0, 5);
  const more = codes.length > named.length ? ` and ${codes.length - named.length} more` : '';
  return { count: codes.length, named, listed: `${named.join(', ')}${more}` };
}
