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
import { subject, type Page, type VisitView } from '@gyre/shared';
import { scopedWhere } from '../auth/access-scope';
import { Caller } from '../auth/decorators';
import { BlindingService } from '../blinding/blinding.service';
import { AuditedWrites, type AuditScope } from '../audit/audited-writes';
import { ScopedRows } from '../common/database/owned-rows';
import { GyreException } from '../common/errors/gyre.exception';
import { givenFields } from '../common/given-fields';
import { assertUnique } from '../common/errors/unique-violation';
import { pageSliceOf, pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { nowIso } from '../common/time';
import { Participant } from '../participants/participant.entity';
import { ParticipantsService } from '../participants/participants.service';
import { PlannedVisit } from '../schedule/planned-visit.entity';
import { PlannedVisitsService } from '../schedule/planned-visits.service';
import { CreateVisitDto, UpdateVisitDto, VisitQueryDto } from './dto/visit.dto';
import { Visit } from './visit.entity';
import { toVisitView, type VisitScheduleContext } from './visit-view';
import { ParticipantsError, participantsError } from '../participants/participants.errors';
import { VisitsError, visitsError } from './visits.errors';

@Injectable()
export class VisitsService extends ScopedRows<Visit> {
  constructor(
    @InjectRepository(Visit) private readonly visits: Repository<Visit>,
    private readonly participants: ParticipantsService,
    private readonly plannedVisits: PlannedVisitsService,
    private readonly audited: AuditedWrites,
    private readonly blinding: BlindingService,
  ) {
    super(visits, 'Visit', (id) => notFound(id, 'id'));
  }

  async list(caller: Caller, query: VisitQueryDto): Promise<Page<VisitView>> {
    const window = pageWindowOf(query);
    const filter: FindOptionsWhere<Visit> = givenFields(query, [
      'participantId',
      'siteId',
      'plannedVisitId',
    ]);
    if (query.from !== undefined && query.to !== undefined) {
      filter.visitDate = Between(query.from, query.to);
    } else if (query.from !== undefined) filter.visitDate = MoreThanOrEqual(query.from);
    else if (query.to !== undefined) filter.visitDate = LessThanOrEqual(query.to);
    // Blinded review: an analyst's lists hold only the visits they recorded their decision on.
    const unblinded = await this.blinding.unblindedVisitIds(caller);
    if (unblinded !== null) filter.id = In(unblinded);
    const rows = await this.visits.findAndCount({
      where: scopedWhere<Visit>(caller.ability, 'read', 'Visit', filter),
      ...pageSliceOf(window, query.sort ?? 'visitDate'),
    });
    const views = await this.viewsOf(rows[0]);
    return toPage([views, rows[1]], window, (view) => view);
  }

  async get(caller: Caller, id: string): Promise<VisitView> {
    const visit = await this.findInScope(caller, 'read', id);
    // Blinded review: an analyst reads the visit's date and names only after their decision.
    await this.blinding.assertVisible(caller, visit);
    return this.viewOf(visit);
  }

  /** For other modules: the visits' views with their schedule status, in the same order. */
  async viewsOf(visits: Visit[], manager?: EntityManager): Promise<VisitView[]> {
    const participants = new Map(
      (
        await this.participants.byIds([...new Set(visits.map((v) => v.participantId))], manager)
      ).map((p) => [p.id, p]),
    );
    const planned = new Map(
      (
        await this.plannedVisits.byIds(
          visits.flatMap((v) => (v.plannedVisitId === null ? [] : [v.plannedVisitId])),
          manager,
        )
      ).map((p) => [p.id, p]),
    );
    return visits.map((visit) =>
      toVisitView(visit, {
        enrolmentDate: participants.get(visit.participantId)?.enrolmentDate ?? null,
        planned: visit.plannedVisitId === null ? null : (planned.get(visit.plannedVisitId) ?? null),
      }),
    );
  }

  /** For other modules: one visit's view with its schedule status. */
  async viewOf(visit: Visit, manager?: EntityManager): Promise<VisitView> {
    const [view] = await this.viewsOf([visit], manager);
    return view;
  }

  async create(caller: Caller, dto: CreateVisitDto): Promise<VisitView> {
    const participant = await this.participants.findInScope(caller, 'read', dto.participantId);
    const scope = { studyId: participant.studyId, siteId: participant.siteId };
    if (!caller.ability.can('create', subject('Visit', scope))) {
      throw notFound(dto.participantId, 'participantId');
    }
    if (dto.plannedVisitId !== undefined && dto.unscheduled === true) {
      throw visitsError(
        VisitsError.PlannedVisitRequired,
        'plannedVisitId: give a planned visit or unscheduled: true, not both',
        { field: 'plannedVisitId' },
      );
    }
    const planned =
      dto.plannedVisitId === undefined
        ? null
        : await this.plannedVisitOfStudy(participant.studyId, dto.plannedVisitId);
    if (planned === null && dto.unscheduled !== true) {
      const schedule = await this.plannedVisits.ofStudy(participant.studyId);
      if (schedule.length > 0) {
        throw visitsError(
          VisitsError.PlannedVisitRequired,
          `plannedVisitId: the study has a visit schedule (${schedule.map((p) => p.name).join(', ')}); pick its planned visit, or send unscheduled: true for a visit outside it`,
          { field: 'plannedVisitId', plannedVisits: schedule.map((p) => p.name) },
        );
      }
    }
    const visit = newVisit(
      participant,
      planned,
      labelFor(planned, dto.label),
      calendarDate(dto.visitDate),
    );
    return this.save(caller, null, visit, undefined, {
      enrolmentDate: participant.enrolmentDate,
      planned,
    });
  }

  async update(caller: Caller, id: string, dto: UpdateVisitDto): Promise<VisitView> {
    const current = await this.findInScope(caller, 'update', id);
    const participant = await this.participants.byId(current.participantId);
    const plannedVisitId =
      dto.plannedVisitId === undefined ? current.plannedVisitId : dto.plannedVisitId;
    const planned =
      plannedVisitId === null
        ? null
        : await this.plannedVisitOfStudy(current.studyId, plannedVisitId);
    const next: Visit = {
      ...current,
      // A visit taken out of the schedule keeps its name unless a new label is given.
      label: planned === null ? (dto.label ?? current.label) : labelFor(planned, dto.label),
      plannedVisitId: planned?.id ?? null,
      visitDate: dto.visitDate === undefined ? current.visitDate : calendarDate(dto.visitDate),
      updatedAt: nowIso(),
    };
    return this.save(caller, current, next, dto.reason, {
      enrolmentDate: participant.enrolmentDate,
      planned,
    });
  }

  /**
   * For the importers (bulk upload, EEG-BIDS import), inside their transaction `tx`: a new
   * visit of `participant` on `planned` and the same audit entry `create` writes. They have
   * checked scope, date and uniqueness for the whole import before.
   */
  async insertPlanned(
    tx: EntityManager,
    caller: Caller,
    input: { participant: Participant; planned: PlannedVisit; visitDate: string; reason: string },
  ): Promise<Visit> {
    const { participant, planned } = input;
    const visit = newVisit(participant, planned, planned.name, input.visitDate);
    await this.audited.insertIn(tx, caller, {
      entity: Visit,
      objectType: 'Visit',
      row: visit,
      scope: visitScope,
      view: (row) => toVisitView(row, { enrolmentDate: participant.enrolmentDate, planned }),
      reason: input.reason,
    });
    return visit;
  }

  /** The planned visit if it belongs to study `studyId` (400 naming it otherwise). */
  private async plannedVisitOfStudy(studyId: string, id: string): Promise<PlannedVisit> {
    const planned = await this.plannedVisits.findById(id);
    if (planned === null || planned.studyId !== studyId) {
      throw visitsError(
        VisitsError.PlannedVisitNotInStudy,
        `plannedVisitId: ${id} is not a planned visit of the participant's study`,
        { field: 'plannedVisitId', value: id },
      );
    }
    return planned;
  }

  private save(
    caller: Caller,
    before: Visit | null,
    visit: Visit,
    reason: string | undefined,
    context: VisitScheduleContext,
  ): Promise<VisitView> {
    return this.audited.save(caller, {
      entity: Visit,
      objectType: 'Visit',
      before,
      row: visit,
      reason,
      scope: visitScope,
      check: async (manager, row) => {
        if (row.plannedVisitId !== null) {
          await assertPlannedVisitFree(manager, row, context.planned?.name ?? '');
        }
        await assertUnique(
          manager,
          Visit,
          { participantId: row.participantId, label: row.label },
          row.id,
        );
      },
      view: (row) => toVisitView(row, context),
      beforeView: (row, manager) => this.viewOf(row, manager),
      duplicate: (row) =>
        visitsError(
          VisitsError.LabelTaken,
          `label: the participant already has a visit ${row.label}`,
          { field: 'label', value: row.label },
        ),
    });
  }

  /** For other modules, unscoped: a participant's visits by date, then label. */
  ofParticipant(participantId: string): Promise<Visit[]> {
    return this.visits.find({
      where: { participantId },
      order: { visitDate: 'ASC', label: 'ASC' },
    });
  }
}

/**
 * A visit on a planned visit is called by its name, so every screen that shows labels keeps
 * working; a different label sent with it is refused rather than silently replaced.
 */
function labelFor(planned: PlannedVisit | null, label: string | undefined): string {
  if (planned === null) {
    if (label === undefined) {
      throw visitsError(
        VisitsError.LabelRequired,
        'label: an unscheduled visit needs a label (unique for the participant)',
        { field: 'label' },
      );
    }
    return label;
  }
  if (label !== undefined && label.toLowerCase() !== planned.name.toLowerCase()) {
    throw visitsError(
      VisitsError.LabelIsPlannedName,
      `label: a visit on planned visit ${planned.name} is labelled ${planned.name}, not ${JSON.stringify(label)}`,
      { field: 'label', value: label, expected: planned.name },
    );
  }
  return planned.name;
}

/** One visit per participant and planned visit: 409 naming the visit that has it. */
async function assertPlannedVisitFree(
  manager: EntityManager,
  visit: Visit,
  plannedName: string,
): Promise<void> {
  const other = await manager.findOne(Visit, {
    where: { participantId: visit.participantId, plannedVisitId: visit.plannedVisitId ?? '' },
  });
  if (other === null || other.id === visit.id) return;
  const participant = await manager.findOneBy(Participant, { id: visit.participantId });
  throw visitsError(
    VisitsError.PlannedVisitTaken,
    `plannedVisitId: ${participant?.code ?? 'the participant'} already has a visit on planned visit ${plannedName} (${other.label}, ${other.visitDate})`,
    {
      field: 'plannedVisitId',
      value: visit.plannedVisitId,
      visitId: other.id,
      visitDate: other.visitDate,
    },
  );
}

/** `YYYY-MM-DD` that names a real day (the pattern alone lets 2026-02-30 through). */
function calendarDate(value: string): string {
  // dayjs rolls an impossible day over (2026-02-30 → 03-02), so a round trip exposes it.
  const parsed = dayjs(value);
  if (!parsed.isValid() || parsed.format('YYYY-MM-DD') !== value) {
    throw visitsError(
      VisitsError.BadDate,
      `visitDate: ${JSON.stringify(value)} is not a calendar date (YYYY-MM-DD)`,
      { field: 'visitDate', value },
    );
  }
  return value;
}

function notFound(id: string, field: string): GyreException {
  return field === 'participantId'
    ? participantsError(
        ParticipantsError.NotFound,
        `participantId: no participant ${id} in your scope`,
        { field, id },
      )
    : visitsError(VisitsError.NotFound, `No visit ${id}`, { field, id });
}

/** A new visit row of `participant`, in its study and site. */
function newVisit(
  participant: Participant,
  planned: PlannedVisit | null,
  label: string,
  visitDate: string,
): Visit {
  const at = nowIso();
  return {
    id: randomUUID(),
    participantId: participant.id,
    studyId: participant.studyId,
    siteId: participant.siteId,
    label,
    plannedVisitId: planned?.id ?? null,
    visitDate,
    createdAt: at,
    updatedAt: at,
  };
}

/** A visit's audit entries belong to its study and site. */
function visitScope(visit: Visit): AuditScope {
  return { studyId: visit.studyId, siteId: visit.siteId };
}
