import { Injectable } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import {
  And,
  Between,
  DataSource,
  Equal,
  FindOptionsWhere,
  LessThanOrEqual,
  MoreThanOrEqual,
  Raw,
  Repository,
} from 'typeorm';
import type { AppAbility, AuditEntryView, AuditVerifyResult, Page } from '@gyre/shared';
import { scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import { pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { sqliteHandleOf } from '../common/database/sqlite-handle';
import { nowIso } from '../common/time';
import { canonicalJson, chainHash, ChainedContent, GENESIS_HASH } from './audit-chain';
import { AuditAnchorService } from './audit-anchor.service';
import { AuditContextReads } from './audit-context.reads';
import { ChainWalk, contentOf } from './audit-chain-walk';
import { AuditEntry } from './audit-entry.entity';
import { AuditError, auditError } from './audit.errors';
import { combineVerify } from './audit-verify';
import { AuditQueryDto } from './dto/audit-query.dto';

/** Who did it. An `AuthUser` fits; `null` for the system or an unknown caller. */
export interface AuditActor {
  id: string | null;
  email: string | null;
  studyId?: string | null;
  siteId?: string | null;
}

export interface AuditRecordInput {
  actor: AuditActor | null;
  /** A verb from `AUDIT_ACTIONS` or a module's own (`upload`, `sign`, `rerun`, …). */
  action: string;
  /** A CASL subject name (`Participant`, `Recording`, …) or `Session` for sign-ins. */
  objectType: string;
  objectId: string | null;
  /** The study/site the object belongs to (who may read the entry); default: the actor's. */
  studyId?: string | null;
  siteId?: string | null;
  /** Response views, never entities: whatever is here is kept for ever. */
  before?: unknown;
  after?: unknown;
  reason?: string | null;
  clientIp?: string | null;
}

/** A caller's change to a row: the entry without what the caller and the row's scope give. */
export type CallerChange = Omit<AuditRecordInput, 'actor' | 'studyId' | 'siteId' | 'clientIp'>;

/** The study and site whose members may read an entry: the changed row's (or its visit's). */
export interface EntryScope {
  studyId: string | null;
  siteId: string | null;
}

/**
 * The scope of an entry about rows across study `studyId` (an import): its site's members
 * read it too when every row is at the same site.
 */
export function studyEntryScope(studyId: string, siteIds: Iterable<string>): EntryScope {
  const sites = new Set(siteIds);
  return { studyId, siteId: sites.size === 1 ? [...sites][0] : null };
}

interface Row extends ChainedContent {
  prevHash: string;
  hash: string;
}

/**
 * The audit trail. Appends run as one synchronous SQLite transaction that reads the last hash
 * and inserts the next entry, so concurrent requests cannot fork the chain; when called inside
 * a `WriteTransactionsService.run`, the entry commits or rolls back with the change it describes.
 */
@Injectable()
export class AuditService {
  private readonly append: (input: AuditRecordInput) => Row;

  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    @InjectRepository(AuditEntry) private readonly entries: Repository<AuditEntry>,
    private readonly anchors: AuditAnchorService,
    private readonly contexts: AuditContextReads,
  ) {
    this.append = (input) => {
      const db = sqliteHandleOf(this.dataSource);
      const write = db.transaction((entry: AuditRecordInput): Row => {
        const last = db
          .prepare(`SELECT "seq", "hash" FROM "audit_entry" ORDER BY "seq" DESC LIMIT 1`)
          .get() as { seq: number; hash: string } | undefined;
        const content: ChainedContent = {
          seq: (last?.seq ?? 0) + 1,
          at: nowIso(),
          actorId: entry.actor?.id ?? null,
          actorEmail: entry.actor?.email ?? null,
          action: entry.action,
          objectType: entry.objectType,
          objectId: entry.objectId,
          studyId: entry.studyId !== undefined ? entry.studyId : (entry.actor?.studyId ?? null),
          siteId: entry.siteId !== undefined ? entry.siteId : (entry.actor?.siteId ?? null),
          before: entry.before === undefined ? null : canonicalJson(entry.before),
          after: entry.after === undefined ? null : canonicalJson(entry.after),
          reason: entry.reason ?? null,
          clientIp: entry.clientIp ?? null,
        };
        const prevHash = last?.hash ?? GENESIS_HASH;
        const row: Row = { ...content, prevHash, hash: chainHash(prevHash, content) };
        db.prepare(
          `INSERT INTO "audit_entry" ("seq", "at", "actorId", "actorEmail", "action", "objectType",
            "objectId", "studyId", "siteId", "before", "after", "reason", "clientIp", "prevHash", "hash")
           VALUES (@seq, @at, @actorId, @actorEmail, @action, @objectType, @objectId, @studyId,
            @siteId, @before, @after, @reason, @clientIp, @prevHash, @hash)`,
        ).run(row);
        return row;
      });
      // Inside an open transaction better-sqlite3 nests as a savepoint; otherwise take the
      // write lock up front (BEGIN IMMEDIATE) so another process cannot slip in between.
      return db.inTransaction ? write(input) : write.immediate(input);
    };
  }

  /** Appends one entry and returns it. */
  async record(input: AuditRecordInput): Promise<AuditEntryView> {
    const row = this.append(input);
    this.anchors.noteAppended(row.seq);
    return toView(row);
  }

  /** Appends the entry of `caller`'s change to a row of `scope`: the actor and address are theirs. */
  recordBy(caller: Caller, scope: EntryScope, change: CallerChange): Promise<AuditEntryView> {
    return this.record({
      ...change,
      actor: caller.user,
      studyId: scope.studyId,
      siteId: scope.siteId,
      clientIp: caller.clientIp,
    });
  }

  async list(ability: AppAbility, query: AuditQueryDto): Promise<Page<AuditEntryView>> {
    const window = pageWindowOf(query, 'desc');
    const rows = await this.entries.findAndCount({
      where: scopedWhere<AuditEntry>(ability, 'read', 'AuditEntry', filtersOf(query)),
      order: { [query.sort ?? 'seq']: window.order, seq: window.order },
      skip: window.skip,
      take: window.take,
    });
    const page = toPage(rows, window, toView);
    // Names and links for this page: a fixed number of reads, under the reader's own scope.
    const contexts = this.contexts.contextsFor(ability, page.items);
    return { ...page, items: page.items.map((item, i) => ({ ...item, context: contexts[i] })) };
  }

  /** Every matching entry, oldest first, in pages of 500 so memory stays flat. */
  async *iterate(ability: AppAbility, query: AuditQueryDto): AsyncGenerator<AuditEntryView> {
    const where = scopedWhere<AuditEntry>(ability, 'read', 'AuditEntry', filtersOf(query));
    for (let skip = 0; ; skip += 500) {
      const batch = await this.entries.find({ where, order: { seq: 'ASC' }, skip, take: 500 });
      for (const row of batch) yield toView(row);
      if (batch.length < 500) return;
    }
  }

  /**
   * Recomputes every hash in sequence order and names the first entry that does not hold, then
   * holds the trail against every signed checkpoint of the anchor file (truncation, re-hashing).
   */
  async verify(): Promise<AuditVerifyResult> {
    const anchors = await this.anchors.check();
    const walk = new ChainWalk();
    for (let afterSeq = 0; ;) {
      const batch = await this.entries
        .createQueryBuilder('e')
        .where('e.seq > :afterSeq', { afterSeq })
        .orderBy('e.seq', 'ASC')
        .take(1000)
        .getMany();
      if (!batch.every((row) => walk.push(row))) break;
      if (batch.length < 1000) break;
      afterSeq = batch[batch.length - 1].seq;
    }
    return combineVerify(walk.result(), anchors);
  }
}

/** Tables of rows below a visit that audit entries name by id (joined through the visit's index). */
const VISIT_CHILD_TABLES = ['recording', 'analysis_run', 'flag', 'report', 'visit_review'];

/** The ids of a participant (`:participantId`), its visits and every row below them. */
const PARTICIPANT_OBJECT_IDS = [
  'SELECT :participantId',
  'SELECT v."id" FROM "visit" v WHERE v."participantId" = :participantId',
  ...VISIT_CHILD_TABLES.map(
    (table) =>
      `SELECT t."id" FROM "${table}" t JOIN "visit" v ON v."id" = t."visitId" WHERE v."participantId" = :participantId`,
  ),
].join(' UNION ALL ');

function filtersOf(query: AuditQueryDto): FindOptionsWhere<AuditEntry> {
  const where: FindOptionsWhere<AuditEntry> = {};
  if (query.actorId !== undefined) where.actorId = query.actorId;
  if (query.action !== undefined) where.action = query.action;
  if (query.objectType !== undefined) where.objectType = query.objectType;
  if (query.participantId !== undefined) {
    // Entries about the participant, its visits and everything below them (object ids are
    // UUIDs, unique across tables, so matching the id alone is enough).
    const about = Raw((column) => `${column} IN (${PARTICIPANT_OBJECT_IDS})`, {
      participantId: query.participantId,
    });
    where.objectId = query.objectId === undefined ? about : And(Equal(query.objectId), about);
  } else if (query.objectId !== undefined) where.objectId = query.objectId;
  const from = query.from === undefined ? undefined : new Date(query.from).toISOString();
  const to = query.to === undefined ? undefined : new Date(query.to).toISOString();
  if (from !== undefined && to !== undefined) {
    if (from > to) {
      throw auditError(AuditError.BadTimeRange, `from (${query.from}) is after to (${query.to})`, {
        field: 'from',
        from: query.from,
        to: query.to,
      });
    }
    where.at = Between(from, to);
  } else if (from !== undefined) where.at = MoreThanOrEqual(from);
  else if (to !== undefined) where.at = LessThanOrEqual(to);
  return where;
}

function parseJson(text: string | null): unknown {
  return text === null ? null : JSON.parse(text);
}

export function toView(row: Row | AuditEntry): AuditEntryView {
  return {
    ...contentOf(row),
    before: parseJson(row.before),
    after: parseJson(row.after),
    prevHash: row.prevHash,
    hash: row.hash,
  };
}
