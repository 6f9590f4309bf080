import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import dayjs from 'dayjs';
import {
  Between,
  EntityManager,
  FindOptionsWhere,
  In,
  LessThanOrEqual,
  MoreThanOrEqual,
  Repository,
} from 'typeorm';
import { subject, type Action, type Page, type SubjectName, type VisitView } from '@gyre/shared';
import { scopedWhere } from '../auth/access-scope';
import { Caller } from '../auth/decorators';
import { AuditService } from '../audit/audit.service';
import { WriteTransactions } from '../common/database/write-transactions.service';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { assertUnique, isUniqueViolation } from '../common/errors/unique-violation';
import { pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { nowIso } from '../common/time';
import { ParticipantsService } from '../participants/participants.service';
import { CreateVisitDto, UpdateVisitDto, VisitQueryDto } from './dto/visit.dto';
import { Visit } from './visit.entity';
import { toVisitView } from './visit-view';
import { VisitsError } from './visits.errors';

@Injectable()
export class VisitsService {
  constructor(
    @InjectRepository(Visit) private readonly visits: Repository<Visit>,
    private readonly participants: ParticipantsService,
    private readonly writes: WriteTransactions,
    private readonly audit: AuditService,
  ) {}

  async list(caller: Caller, query: VisitQueryDto): Promise<Page<VisitView>> {
    const window = pageWindowOf(query);
    const filter: FindOptionsWhere<Visit> = {};
    if (query.participantId !== undefined) filter.participantId = query.participantId;
    if (query.siteId !== undefined) filter.siteId = query.siteId;
    if (query.from !== undefined && query.to !== undefined) {
      filter.visitDate = Between(query.from, query.to);
    } else if (query.from !== undefined) filter.visitDate = MoreThanOrEqual(query.from);
    else if (query.to !== undefined) filter.visitDate = LessThanOrEqual(query.to);
    const rows = await this.visits.findAndCount({
      where: scopedWhere<Visit>(caller.ability, 'read', 'Visit', filter),
      order: { [query.sort ?? 'visitDate']: window.order, id: 'ASC' },
      skip: window.skip,
      take: window.take,
    });
    return toPage(rows, window, toVisitView);
  }

  async get(caller: Caller, id: string): Promise<VisitView> {
    return toVisitView(await this.findInScope(caller, 'read', id));
  }

  async create(caller: Caller, dto: CreateVisitDto): Promise<VisitView> {
    const participant = await this.participants.findInScope(caller, 'read', dto.participantId);
    const scope = { studyId: participant.studyId, siteId: participant.siteId };
    if (!caller.ability.can('create', subject('Visit', scope))) {
      throw notFound(dto.participantId, 'participantId');
    }
    const at = nowIso();
    const visit: Visit = {
      id: randomUUID(),
      participantId: participant.id,
      ...scope,
      label: dto.label,
      visitDate: calendarDate(dto.visitDate),
      createdAt: at,
      updatedAt: at,
    };
    return this.save(caller, null, visit, undefined);
  }

  async update(caller: Caller, id: string, dto: UpdateVisitDto): Promise<VisitView> {
    const current = await this.findInScope(caller, 'update', id);
    const next: Visit = {
      ...current,
      label: dto.label ?? current.label,
      visitDate: dto.visitDate === undefined ? current.visitDate : calendarDate(dto.visitDate),
      updatedAt: nowIso(),
    };
    return this.save(caller, current, next, dto.reason);
  }

  private async save(
    caller: Caller,
    before: Visit | null,
    visit: Visit,
    reason: string | undefined,
  ): Promise<VisitView> {
    try {
      return await this.writes.run(async (manager) => {
        await assertUnique(
          manager,
          Visit,
          { participantId: visit.participantId, label: visit.label },
          visit.id,
        );
        await manager.save(Visit, visit);
        const view = toVisitView(visit);
        await this.audit.record({
          actor: caller.user,
          action: before === null ? 'create' : 'update',
          objectType: 'Visit',
          objectId: visit.id,
          studyId: visit.studyId,
          siteId: visit.siteId,
          before: before === null ? undefined : toVisitView(before),
          after: view,
          reason: reason ?? null,
          clientIp: caller.clientIp,
        });
        return view;
      });
    } catch (error) {
      if (isUniqueViolation(error)) {
        throw new GyreException(
          ErrorKind.Conflict,
          VisitsError.LabelTaken,
          `label: the participant already has a visit ${visit.label}`,
          { field: 'label', value: visit.label },
        );
      }
      throw error;
    }
  }

  /** For other modules (recordings): the visit if the caller may act on it, else 404. */
  async findInScope(caller: Caller, action: 'read' | 'update', id: string): Promise<Visit> {
    const visit = await this.visits.findOne({
      where: scopedWhere<Visit>(caller.ability, action, 'Visit', { id }),
    });
    if (visit === null) throw notFound(id, 'id');
    return visit;
  }

  /**
   * For other modules: the visit if the caller may `action` a `subjectName` of it (that
   * subject's scope, applied to the visit row in the query), else null for their own 404.
   */
  inScopeOf(
    caller: Caller,
    action: Action,
    subjectName: SubjectName,
    id: string,
  ): Promise<Visit | null> {
    return this.visits.findOne({
      where: scopedWhere<Visit>(caller.ability, action, subjectName, { id }),
    });
  }

  /** For other modules holding the id (unscoped); `manager` reads inside their transaction. */
  byId(id: string, manager?: EntityManager): Promise<Visit> {
    return this.repo(manager).findOneByOrFail({ id });
  }

  /** For other modules, unscoped: the visits among `ids` (missing ones are left out). */
  async byIds(ids: string[], manager?: EntityManager): Promise<Visit[]> {
    if (ids.length === 0) return [];
    return this.repo(manager).find({ where: { id: In(ids) } });
  }

  /** For other modules, unscoped: a participant's visits by date, then label. */
  ofParticipant(participantId: string): Promise<Visit[]> {
    return this.visits.find({
      where: { participantId },
      order: { visitDate: 'ASC', label: 'ASC' },
    });
  }

  private repo(manager: EntityManager | undefined): Repository<Visit> {
    return manager?.getRepository(Visit) ?? this.visits;
  }
}

/** `YYYY-MM-DD` that names a real day (the pattern alone lets 2026-02-30 through). */
function calendarDate(value: string): string {
  // dayjs rolls an impossible day over (2026-02-30 → 03-02), so a round trip exposes it.
  const parsed = dayjs(value);
  if (!parsed.isValid() || parsed.format('YYYY-MM-DD') !== value) {
    throw new GyreException(
      ErrorKind.BadInput,
      VisitsError.BadDate,
      `visitDate: ${JSON.stringify(value)} is not a calendar date (YYYY-MM-DD)`,
      { field: 'visitDate', value },
    );
  }
  return value;
}

function notFound(id: string, field: string): GyreException {
  return new GyreException(
    ErrorKind.NotFound,
    field === 'participantId' ? 'PARTICIPANT_NOT_FOUND' : VisitsError.NotFound,
    field === 'participantId'
      ? `participantId: no participant ${id} in your scope`
      : `No visit ${id}`,
    { field, id },
  );
}
