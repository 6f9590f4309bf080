import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { EntityManager, Repository } from 'typeorm';
import { subject, type Page, type SiteView } from '@gyre/shared';
import { Caller } from '../auth/decorators';
import { AuditedWrites, type AuditScope } from '../audit/audited-writes';
import { ScopedRows } from '../common/database/owned-rows';
import { GyreException } from '../common/errors/gyre.exception';
import { assertUnique } from '../common/errors/unique-violation';
import { pageSliceOf, pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { givenFields } from '../common/given-fields';
import { scopedSearchWhere } from '../common/pagination/list-where';
import { nowIso } from '../common/time';
import { StudiesService } from '../studies/studies.service';
import { CreateSiteDto, SiteQueryDto, UpdateSiteDto } from './dto/site.dto';
import { Site } from './site.entity';
import { toSiteView } from './site-view';
import { SitesError, sitesError } from './sites.errors';

@Injectable()
export class SitesService extends ScopedRows<Site> {
  constructor(
    @InjectRepository(Site) private readonly sites: Repository<Site>,
    private readonly studies: StudiesService,
    private readonly audited: AuditedWrites,
  ) {
    super(sites, 'Site', (id) => notFound(id, 'id'));
  }

  async list(caller: Caller, query: SiteQueryDto): Promise<Page<SiteView>> {
    const window = pageWindowOf(query);
    const filter = givenFields(query, ['studyId']);
    const search = query.q === undefined ? undefined : { code: query.q, name: query.q };
    const rows = await this.sites.findAndCount({
      where: scopedSearchWhere<Site>(caller.ability, 'Site', filter, search),
      ...pageSliceOf(window, query.sort ?? 'code'),
    });
    return toPage(rows, window, toSiteView);
  }

  async get(caller: Caller, id: string): Promise<SiteView> {
    return toSiteView(await this.findInScope(caller, 'read', id));
  }

  async create(caller: Caller, dto: CreateSiteDto): Promise<SiteView> {
    const study = await this.studies.findInScope(caller, 'read', dto.studyId);
    if (!caller.ability.can('create', subject('Site', { studyId: study.id }))) {
      throw notFound(dto.studyId, 'studyId');
    }
    const at = nowIso();
    const site: Site = {
      id: randomUUID(),
      studyId: study.id,
      code: dto.code,
      name: dto.name.trim(),
      createdAt: at,
      updatedAt: at,
    };
    return this.save(caller, null, site);
  }

  async update(caller: Caller, id: string, dto: UpdateSiteDto): Promise<SiteView> {
    const current = await this.findInScope(caller, 'update', id);
    const next: Site = {
      ...current,
      code: dto.code ?? current.code,
      name: dto.name?.trim() ?? current.name,
      updatedAt: nowIso(),
    };
    return this.save(caller, current, next);
  }

  /** Only an empty site can go: participants and accounts keep theirs for the trail. */
  async remove(caller: Caller, id: string, reason: string | undefined): Promise<void> {
    const site = await this.findInScope(caller, 'delete', id);
    await this.audited.remove(caller, {
      entity: Site,
      objectType: 'Site',
      row: site,
      reason,
      scope: siteScope,
      view: toSiteView,
      check: async (manager) => {
        const [{ participants, users }] = (await manager.query(
          `SELECT (SELECT COUNT(*) FROM "participant" WHERE "siteId" = ?) AS participants,
                  (SELECT COUNT(*) FROM "user" WHERE "siteId" = ?) AS users`,
          [id, id],
        )) as { participants: number; users: number }[];
        if (participants > 0 || users > 0) {
          throw sitesError(
            SitesError.InUse,
            `Site ${site.code} still has ${participants} participant(s) and ${users} user(s)`,
            { participants, users },
          );
        }
      },
    });
  }

  private save(caller: Caller, before: Site | null, site: Site): Promise<SiteView> {
    return this.audited.save(caller, {
      entity: Site,
      objectType: 'Site',
      before,
      row: site,
      scope: siteScope,
      check: (manager, row) =>
        assertUnique(manager, Site, { studyId: row.studyId, code: row.code }, row.id),
      view: toSiteView,
      duplicate: (row) =>
        sitesError(
          SitesError.CodeTaken,
          `code: this study already has a site with code ${row.code}`,
          {
            field: 'code',
            value: row.code,
          },
        ),
    });
  }

  /** For other modules, unscoped: whether site `id` exists and belongs to study `studyId`. */
  async existsInStudy(id: string, studyId: string, manager?: EntityManager): Promise<boolean> {
    return (await this.repo(manager).countBy({ id, studyId })) > 0;
  }
}

function notFound(id: string, field: string): GyreException {
  return sitesError(SitesError.NotFound, `No site ${id}`, { field, id });
}

/** A site's audit entries belong to its study and to the site itself. */
function siteScope(site: Site): AuditScope {
  return { studyId: site.studyId, siteId: site.id };
}
