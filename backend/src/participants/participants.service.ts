import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { FindOptionsWhere, Repository } from 'typeorm';
import {
  isCalendarDate,
  subject,
  type Action,
  type Page,
  type ParticipantListItem,
  type ParticipantView,
  type SubjectName,
} from '@gyre/shared';
import { scopedWhere, scopeSql } from '../auth/access-scope';
import { Caller } from '../auth/decorators';
import { BlindingService } from '../blinding/blinding.service';
import { AuditedWrites } from '../audit/audited-writes';
import { ScopedRows } from '../common/database/owned-rows';
import { SqlEntityRows, sqlPage } from '../common/database/sql-rows';
import { SqliteReadsService, type SqlValue } from '../common/database/sqlite-reads.service';
import type { GyreException } from '../common/errors/gyre.exception';
import { assertUnique } from '../common/errors/unique-violation';
import { pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { likePattern } from '../common/pagination/text-filter';
import { nowIso } from '../common/time';
import { StudyGroupsService } from '../schedule/study-groups.service';
import { SitesError, sitesError } from '../sites/sites.errors';
import { SitesService } from '../sites/sites.service';
import {
  CreateParticipantDto,
  PARTICIPANT_SORT_FIELDS,
  ParticipantQueryDto,
  UpdateParticipantDto,
} from './dto/participant.dto';
import { Participant } from './participant.entity';
import { ParticipantListExtras } from './participant-list-extras';
import { toParticipantView } from './participant-view';
import { ParticipantsError, participantsError } from './participants.errors';

@Injectable()
export class ParticipantsService extends ScopedRows<Participant> {
  /** The list's rows as TypeORM reads them (built at the first list). */
  private rowsSql: SqlEntityRows<Participant> | undefined;

  constructor(
    @InjectRepository(Participant) private readonly participants: Repository<Participant>,
    private readonly sites: SitesService,
    private readonly groups: StudyGroupsService,
    private readonly audited: AuditedWrites,
    private readonly reads: SqliteReadsService,
    private readonly listExtras: ParticipantListExtras,
    private readonly blinding: BlindingService,
  ) {
    super(participants, 'Participant', (id) => notFound(id, 'id'));
  }

  /**
   * A hot route: prepared statements for the page and its count (sql-rows.ts), then a fixed
   * number more for what each row shows of its visits (participant-list-extras.ts).
   */
  async list(caller: Caller, query: ParticipantQueryDto): Promise<Page<ParticipantListItem>> {
    const window = pageWindowOf(query);
    const scope = scopeSql(caller.ability, 'read', 'Participant', 'p');
    const where = [scope.sql];
    const params: SqlValue[] = [...scope.params];
    if (query.siteId !== undefined) {
      where.push(`p."siteId" = ?`);
      params.push(query.siteId);
    }
    if (query.q !== undefined) {
      where.push(`p."code" LIKE ? ESCAPE '\\'`);
      params.push(likePattern(query.q.toUpperCase()));
    }
    if (query.groupId !== undefined) {
      where.push(`p."groupId" = ?`);
      params.push(query.groupId);
    }
    // Blinded review: an analyst lists only participants with a visit they decided on.
    const open = await this.blinding.unblindedParticipantIds(caller);
    if (open !== null) {
      where.push(`p."id" IN (SELECT value FROM json_each(?))`);
      params.push(JSON.stringify([...open]));
    }
    const sort = PARTICIPANT_SORT_FIELDS.find((field) => field === (query.sort ?? 'code'));
    if (sort === undefined) throw new Error(`Unknown sort ${String(query.sort)}`);
    const rows = (this.rowsSql ??= new SqlEntityRows<Participant>(
      this.participants.metadata,
      this.participants.manager.connection.driver,
      'p',
    ));
    const [found, total] = sqlPage(
      this.reads,
      {
        columns: rows.columns,
        from: '"participant" p',
        where,
        params,
        orderBy: `p."${sort}" ${window.order}, p."id" ASC`,
      },
      window,
    );
    const participants = found.map((r) => rows.hydrate(r));
    const extras = this.listExtras.of(
      caller,
      participants.map((p) => p.id),
      await this.blinding.unblindedVisitIds(caller),
    );
    return toPage([participants, total], window, (participant): ParticipantListItem => {
      const more = extras.get(participant.id);
      if (more === undefined) throw new Error(`Participant ${participant.id} has no site row`);
      return { ...toParticipantView(participant), ...more };
    });
  }

  async get(caller: Caller, id: string): Promise<ParticipantView> {
    const participant = await this.findInScope(caller, 'read', id);
    await this.blinding.assertParticipantVisible(caller, participant.id);
    return toParticipantView(participant);
  }

  async create(caller: Caller, dto: CreateParticipantDto): Promise<ParticipantView> {
    const siteId = dto.siteId ?? caller.user.siteId;
    if (siteId === null) {
      throw participantsError(
        ParticipantsError.SiteRequired,
        'siteId: required for your role (you belong to no single site)',
        { field: 'siteId' },
      );
    }
    const site = await this.sites.findInScope(caller, 'read', siteId);
    // A site the caller can see but may not register at is still "not yours": 404, not 403.
    if (!caller.ability.can('create', subject('Participant', { studyId: site.studyId, siteId }))) {
      throw notFound(siteId, 'siteId');
    }
    const at = nowIso();
    const participant: Participant = {
      id: randomUUID(),
      studyId: site.studyId,
      siteId: site.id,
      code: dto.code,
      enrolmentDate: enrolmentDateOf(dto.enrolmentDate ?? null),
      groupId: await this.groupOfStudy(site.studyId, dto.groupId ?? null),
      createdAt: at,
      updatedAt: at,
    };
    return this.save(caller, null, participant, undefined);
  }

  async update(caller: Caller, id: string, dto: UpdateParticipantDto): Promise<ParticipantView> {
    const current = await this.findInScope(caller, 'update', id);
    const next: Participant = {
      ...current,
      code: dto.code ?? current.code,
      enrolmentDate:
        dto.enrolmentDate === undefined
          ? current.enrolmentDate
          : enrolmentDateOf(dto.enrolmentDate),
      groupId:
        dto.groupId === undefined
          ? current.groupId
          : await this.groupOfStudy(current.studyId, dto.groupId),
      updatedAt: nowIso(),
    };
    return this.save(caller, current, next, dto.reason);
  }

  private save(
    caller: Caller,
    before: Participant | null,
    participant: Participant,
    reason: string | undefined,
  ): Promise<ParticipantView> {
    return this.audited.save(caller, {
      entity: Participant,
      objectType: 'Participant',
      before,
      row: participant,
      reason,
      scope: (row) => ({ studyId: row.studyId, siteId: row.siteId }),
      check: (manager, row) =>
        assertUnique(manager, Participant, { studyId: row.studyId, code: row.code }, row.id),
      view: toParticipantView,
      duplicate: (row) =>
        participantsError(
          ParticipantsError.CodeTaken,
          `code: the study already has a participant ${row.code}`,
          { field: 'code', value: row.code },
        ),
    });
  }

  /** `groupId` if it names a group of study `studyId` (400 naming it otherwise). */
  private async groupOfStudy(studyId: string, groupId: string | null): Promise<string | null> {
    if (groupId === null) return null;
    const group = await this.groups.findById(groupId);
    if (group === null || group.studyId !== studyId) {
      throw participantsError(
        ParticipantsError.GroupNotInStudy,
        `groupId: ${groupId} is not a group of the participant's study`,
        { field: 'groupId', value: groupId },
      );
    }
    return group.id;
  }

  /**
   * For other modules: every participant matching `where` that the caller may `action` a
   * `subjectName` of (that subject's scope applied to the participant rows), by code.
   */
  listInScopeOf(
    caller: Caller,
    action: Action,
    subjectName: SubjectName,
    where: FindOptionsWhere<Participant>,
  ): Promise<Participant[]> {
    return this.participants.find({
      where: scopedWhere<Participant>(caller.ability, action, subjectName, where),
      order: { code: 'ASC' },
    });
  }
}

/** A real calendar day (the pattern alone lets 2026-02-30 through), or null. */
function enrolmentDateOf(value: string | null): string | null {
  if (value === null) return null;
  if (!isCalendarDate(value)) {
    throw participantsError(
      ParticipantsError.BadDate,
      `enrolmentDate: ${JSON.stringify(value)} is not a calendar date (YYYY-MM-DD)`,
      { field: 'enrolmentDate', value },
    );
  }
  return value;
}

function notFound(id: string, field: string): GyreException {
  return field === 'siteId'
    ? sitesError(SitesError.NotFound, `siteId: no site ${id} in your scope`, { field, id })
    : participantsError(ParticipantsError.NotFound, `No participant ${id}`, { field, id });
}
