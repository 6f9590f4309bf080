// Raw SQL over the owning tables, not their services: every module that owns those rows
// records into the audit trail, so the global audit module asking them back would be circular.
import { Injectable } from '@nestjs/common';
import type { Action, AppAbility, AuditEntryContext, SubjectName } from '@gyre/shared';
import { scopeSql, type ScopeSql } from '../auth/access-scope';
import { SqliteReadsService } from '../common/database/sqlite-reads.service';

/** The entry fields the context is read from. */
export interface ContextSource {
  actorId: string | null;
  objectType: string;
  objectId: string | null;
  before: unknown;
  after: unknown;
}

interface Link {
  id: string;
  visitId: string | null;
  participantId: string | null;
  kind: string | null;
}

/** Object types whose id is the id of a row that names its visit (and participant). */
const VISIT_CHILD_TABLES: Record<string, { table: string; participant: boolean; kind: boolean }> = {
  Recording: { table: 'recording', participant: true, kind: true },
  Flag: { table: 'flag', participant: true, kind: false },
  Report: { table: 'report', participant: true, kind: false },
  AnalysisRun: { table: 'analysis_run', participant: true, kind: true },
  VisitReview: { table: 'visit_review', participant: false, kind: false },
};

/** What names a row of each subject an entry can point at: a visit's label, a code, a name. */
const NAME_COLUMNS = {
  Visit: { table: 'visit', column: 'label' },
  Participant: { table: 'participant', column: 'code' },
  User: { table: 'user', column: 'name' },
} as const;
type NamedSubject = keyof typeof NAME_COLUMNS;

/** Object types whose objectId is a visit's id (an override is keyed by its visit). */
const VISIT_ID_TYPES = new Set(['Visit', 'VisitAnalysisOverride']);

const isRecord = (value: unknown): value is Record<string, unknown> =>
  typeof value === 'object' && value !== null && !Array.isArray(value);

/** User ids an entry's before/after names: `…ById` fields and `actorId`/`userId`. */
function mentionedUserIds(value: unknown, into: Set<string>): void {
  if (!isRecord(value)) return;
  for (const [key, field] of Object.entries(value)) {
    if (typeof field === 'string' && (/ById$/.test(key) || key === 'userId')) into.add(field);
    else if (isRecord(field)) mentionedUserIds(field, into);
  }
}

/** `scopeSql`, or null when the reader may not read that subject at all (then nothing is named). */
function scopeOrNull(
  ability: AppAbility,
  action: Action,
  subject: SubjectName,
  alias: string,
): ScopeSql | null {
  try {
    return scopeSql(ability, action, subject, alias);
  } catch {
    return null;
  }
}

/**
 * For one page of entries: the participant code, visit label, recording kind and people's names
 * behind the ids, in four queries whatever the page size (links, visits, participants, users).
 * Each name is read under the reader's own row scope, so an entry never names what the reader
 * could not open.
 */
@Injectable()
export class AuditContextReads {
  constructor(private readonly reads: SqliteReadsService) {}

  contextsFor(ability: AppAbility, entries: readonly ContextSource[]): AuditEntryContext[] {
    const links = this.links(entries);
    const visitIds = new Set<string>();
    const participantIds = new Set<string>();
    const userIds = new Set<string>();
    for (const entry of entries) {
      if (entry.actorId !== null) userIds.add(entry.actorId);
      if (entry.objectType === 'User' && entry.objectId !== null) userIds.add(entry.objectId);
      mentionedUserIds(entry.before, userIds);
      mentionedUserIds(entry.after, userIds);
      const link = entry.objectId === null ? undefined : links.get(entry.objectId);
      if (link?.visitId) visitIds.add(link.visitId);
      if (link?.participantId) participantIds.add(link.participantId);
      if (entry.objectType === 'Participant' && entry.objectId !== null) {
        participantIds.add(entry.objectId);
      }
    }
    const visits = this.named(ability, 'Visit', visitIds);
    const participants = this.named(ability, 'Participant', participantIds);
    const users = this.named(ability, 'User', userIds);
    return entries.map((entry) => {
      const link = entry.objectId === null ? undefined : links.get(entry.objectId);
      const participantId =
        entry.objectType === 'Participant' ? entry.objectId : (link?.participantId ?? null);
      const visitId = link?.visitId ?? null;
      const visitLabel = visitId === null ? undefined : visits.get(visitId);
      const participantCode = participantId === null ? undefined : participants.get(participantId);
      const people: Record<string, string> = {};
      const mentioned = new Set<string>();
      if (entry.objectType === 'User' && entry.objectId !== null) mentioned.add(entry.objectId);
      mentionedUserIds(entry.before, mentioned);
      mentionedUserIds(entry.after, mentioned);
      for (const id of mentioned) {
        const name = users.get(id);
        if (name !== undefined) people[id] = name;
      }
      return {
        actorName: entry.actorId === null ? null : (users.get(entry.actorId) ?? null),
        participantId: participantCode === undefined ? null : participantId,
        participantCode: participantCode ?? null,
        visitId: visitLabel === undefined ? null : visitId,
        visitLabel: visitLabel ?? null,
        recordingKind: visitLabel === undefined ? null : (link?.kind ?? null),
        people,
      };
    });
  }

  /** Object id → its visit and participant (one UNION over the tables below a visit). */
  private links(entries: readonly ContextSource[]): Map<string, Link> {
    const byType = new Map<string, string[]>();
    for (const entry of entries) {
      if (entry.objectId === null) continue;
      const type = VISIT_ID_TYPES.has(entry.objectType) ? 'Visit' : entry.objectType;
      if (type !== 'Visit' && VISIT_CHILD_TABLES[type] === undefined) continue;
      byType.set(type, [...(byType.get(type) ?? []), entry.objectId]);
    }
    const parts: string[] = [];
    const params: string[] = [];
    const visitIds = byType.get('Visit');
    if (visitIds !== undefined) {
      parts.push(
        `SELECT "id", "id" AS "visitId", "participantId", NULL AS "kind" FROM "visit"
          WHERE "id" IN (SELECT value FROM json_each(?))`,
      );
      params.push(JSON.stringify(visitIds));
    }
    for (const [type, { table, participant, kind }] of Object.entries(VISIT_CHILD_TABLES)) {
      const ids = byType.get(type);
      if (ids === undefined) continue;
      const participantColumn = participant
        ? `t."participantId"`
        : `(SELECT v."participantId" FROM "visit" v WHERE v."id" = t."visitId")`;
      parts.push(
        `SELECT t."id" AS "id", t."visitId" AS "visitId", ${participantColumn} AS "participantId",
          ${kind ? 't."kind"' : 'NULL'} AS "kind" FROM "${table}" t
          WHERE t."id" IN (SELECT value FROM json_each(?))`,
      );
      params.push(JSON.stringify(ids));
    }
    if (parts.length === 0) return new Map();
    const rows = this.reads.all<Link>(parts.join(' UNION ALL '), params);
    return new Map(rows.map((row) => [row.id, row]));
  }

  /** id → name of the rows among `ids` the reader may read. */
  private named(ability: AppAbility, subject: NamedSubject, ids: Set<string>): Map<string, string> {
    if (ids.size === 0) return new Map();
    const scope = scopeOrNull(ability, 'read', subject, 't');
    if (scope === null) return new Map();
    const { table, column } = NAME_COLUMNS[subject];
    const rows = this.reads.all<{ id: string; name: string }>(
      `SELECT t."id" AS "id", t."${column}" AS "name" FROM "${table}" t
        WHERE t."id" IN (SELECT value FROM json_each(?)) AND ${scope.sql}`,
      [JSON.stringify([...ids]), ...scope.params],
    );
    return new Map(rows.map((row) => [row.id, row.name]));
  }
}
