import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { EntityManager, Repository } from 'typeorm';
import {
  DEFAULT_TREND_MIN_SPAN_DAYS,
  DEFAULT_TREND_MIN_VISITS,
  type Page,
  type StudyView,
} from '@gyre/shared';
import { Caller } from '../auth/decorators';
import { AuditedWrites } from '../audit/audited-writes';
import { ScopedRows } from '../common/database/owned-rows';
import { assertUnique } from '../common/errors/unique-violation';
import { pageSliceOf, pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { scopedSearchWhere } from '../common/pagination/list-where';
import { nowIso } from '../common/time';
import { CreateStudyDto, StudyQueryDto, UpdateStudyDto } from './dto/study.dto';
import { StudiesError, studiesError } from './studies.errors';
import { Study } from './study.entity';
import { toStudyView } from './study-view';

@Injectable()
export class StudiesService extends ScopedRows<Study> {
  constructor(
    @InjectRepository(Study) private readonly studies: Repository<Study>,
    private readonly audited: AuditedWrites,
  ) {
    super(studies, 'Study', (id) => studiesError(StudiesError.NotFound, `No study ${id}`, { id }));
  }

  async list(caller: Caller, query: StudyQueryDto): Promise<Page<StudyView>> {
    const window = pageWindowOf(query);
    const search = query.q === undefined ? undefined : { code: query.q, name: query.q };
    const rows = await this.studies.findAndCount({
      where: scopedSearchWhere<Study>(caller.ability, 'Study', {}, search),
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

  /** For other modules, unscoped: whether study `id` exists. */
  async exists(id: string, manager?: EntityManager): Promise<boolean> {
    return (await this.repo(manager).countBy({ id })) > 0;
  }
}
