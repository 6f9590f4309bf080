import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { EntityManager, FindOptionsWhere, Repository } from 'typeorm';
import {
  DEFAULT_TREND_MIN_SPAN_DAYS,
  DEFAULT_TREND_MIN_VISITS,
  type Page,
  type StudyView,
} from '@gyre/shared';
import { scopedWhere } from '../auth/access-scope';
import { Caller } from '../auth/decorators';
import { AuditedWrites } from '../audit/audited-writes';
import { assertUnique } from '../common/errors/unique-violation';
import { pageSliceOf, pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { containsText } from '../common/pagination/text-filter';
import { nowIso } from '../common/time';
import { CreateStudyDto, StudyQueryDto, UpdateStudyDto } from './dto/study.dto';
import { StudiesError, studiesError } from './studies.errors';
import { Study } from './study.entity';
import { toStudyView } from './study-view';

@Injectable()
export class StudiesService {
  constructor(
    @InjectRepository(Study) private readonly studies: Repository<Study>,
    private readonly audited: AuditedWrites,
  ) {}

  async list(caller: Caller, query: StudyQueryDto): Promise<Page<StudyView>> {
    const window = pageWindowOf(query);
    const filters: FindOptionsWhere<Study>[] =
      query.q === undefined
        ? [{}]
        : [{ code: containsText(query.q) }, { name: containsText(query.q) }];
    const where = filters.flatMap((filter) =>
      scopedWhere<Study>(caller.ability, 'read', 'Study', filter),
    );
    const rows = await this.studies.findAndCount({
      where,
      ...pageSliceOf(window, query.sort ?? 'code'),
    });
    return toPage(rows, window, toStudyView);
  }

  async get(caller: Caller, id: string): Promise<StudyView> {
    return toStudyView(await this.findInScope(caller, 'read', id));
  }

  async create(caller: Caller, dto: CreateStudyDto): Promise<StudyView> {
    const at = nowIso();
    const study: Study = {
      id: randomUUID(),
      code: dto.code,
      name: dto.name.trim(),
      description: dto.description?.trim() ?? '',
      trendMinVisits: dto.trendMinVisits ?? DEFAULT_TREND_MIN_VISITS,
      trendMinSpanDays: dto.trendMinSpanDays ?? DEFAULT_TREND_MIN_SPAN_DAYS,
      blindedReview: dto.blindedReview ?? false,
      createdAt: at,
      updatedAt: at,
    };
    return this.save(caller, null, study);
  }

  async update(caller: Caller, id: string, dto: UpdateStudyDto): Promise<StudyView> {
    const current = await this.findInScope(caller, 'update', id);
    const next: Study = {
      ...current,
      code: dto.code ?? current.code,
      name: dto.name?.trim() ?? current.name,
      description: dto.description?.trim() ?? current.description,
      trendMinVisits: dto.trendMinVisits ?? current.trendMinVisits,
      trendMinSpanDays: dto.trendMinSpanDays ?? current.trendMinSpanDays,
      blindedReview: dto.blindedReview ?? current.blindedReview,
      updatedAt: nowIso(),
    };
    if (next.blindedReview !== current.blindedReview && dto.reason === undefined) {
      throw studiesError(
        StudiesError.ReasonRequired,
        `reason: turning blinded review ${next.blindedReview ? 'on' : 'off'} needs a reason of at least 10 characters`,
        { field: 'reason' },
      );
    }
    return this.save(caller, current, next, dto.reason);
  }

  private save(
    caller: Caller,
    before: Study | null,
    study: Study,
    reason?: string,
  ): Promise<StudyView> {
    return this.audited.save(caller, {
      entity: Study,
      objectType: 'Study',
      reason,
      before,
      row: study,
      scope: (row) => ({ studyId: row.id, siteId: null }),
      check: (manager, row) => assertUnique(manager, Study, { code: row.code }, row.id),
      view: toStudyView,
      duplicate: (row) =>
        studiesError(StudiesError.CodeTaken, `code: a study with code ${row.code} exists`, {
          field: 'code',
          value: row.code,
        }),
    });
  }

  /** Row-level scope inside the query: a study outside it is reported as not found. */
  async findInScope(caller: Caller, action: 'read' | 'update', id: string): Promise<Study> {
    const study = await this.studies.findOne({
      where: scopedWhere<Study>(caller.ability, action, 'Study', { id }),
    });
    if (study === null) {
      throw studiesError(StudiesError.NotFound, `No study ${id}`, { id });
    }
    return study;
  }

  /** For other modules holding the id (unscoped); `manager` reads inside their transaction. */
  byId(id: string, manager?: EntityManager): Promise<Study> {
    return this.repo(manager).findOneByOrFail({ id });
  }

  /** For other modules, unscoped: the study, or null when there is none. */
  findById(id: string, manager?: EntityManager): Promise<Study | null> {
    return this.repo(manager).findOneBy({ id });
  }

  /** For other modules, unscoped: whether study `id` exists. */
  async exists(id: string, manager?: EntityManager): Promise<boolean> {
    return (await this.repo(manager).countBy({ id })) > 0;
  }

  private repo(manager: EntityManager | undefined): Repository<Study> {
    return manager?.getRepository(Study) ?? this.studies;
  }
}
