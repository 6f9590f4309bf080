import type { EntityManager, FindOptionsWhere, ObjectLiteral, Repository } from 'typeorm';
import { subject } from '@gyre/shared';
import type { AuditScope } from '../audit/audited-writes';
import { scopedWhere } from '../auth/access-scope';
import type { Caller } from '../auth/decorators';
import type { GyreException } from '../common/errors/gyre.exception';
import { DuplicateRowError } from '../common/errors/unique-violation';
import type { StudiesService } from '../studies/studies.service';
import { StudiesError, studiesError } from '../studies/studies.errors';

/** The two kinds of row a study's schedule is made of; both belong to the study, no site. */
type StudyRowSubject = 'PlannedVisit' | 'StudyGroup';

/** The audit scope of a schedule row: its study, no site. */
export const studyRowScope = (row: { studyId: string }): AuditScope => ({
  studyId: row.studyId,
  siteId: null,
});

/** 404 unless the caller reads study `studyId` and may `action` its `subjectName` rows. */
export async function assertStudyWritable(
  studies: StudiesService,
  caller: Caller,
  subjectName: StudyRowSubject,
  action: 'create' | 'update' | 'delete',
  studyId: string,
  what: string,
): Promise<void> {
  await studies.findInScope(caller, 'read', studyId);
  if (!caller.ability.can(action, subject(subjectName, { studyId }))) {
    throw studiesError(StudiesError.NotFound, `No study ${studyId} whose ${what} you may change`, {
      id: studyId,
    });
  }
}

/** The row `id` of study `studyId` in the caller's scope for `action`, else `notFound()`. */
export async function findStudyRow<Row extends ObjectLiteral & { id: string; studyId: string }>(
  rows: Repository<Row>,
  caller: Caller,
  subjectName: StudyRowSubject,
  action: 'read' | 'update' | 'delete',
  key: { studyId: string; id: string },
  notFound: () => GyreException,
): Promise<Row> {
  const row = await rows.findOne({
    where: scopedWhere<Row>(caller.ability, action, subjectName, key as FindOptionsWhere<Row>),
  });
  if (row === null) throw notFound();
  return row;
}

/** The participant codes an SQL query names, ordered; with the first five for a message. */
export async function codesInUse(
  manager: EntityManager,
  sql: string,
  id: string,
): Promise<{ count: number; named: string[]; listed: string }> {
  const codes = ((await manager.query(sql, [id])) as { code: string }[]).map((r) => r.code);
  const named = codes.slice(0, 5);
  const more = codes.length > named.length ? ` and ${codes.length - named.length} more` : '';
  return { count: codes.length, named, listed: `${named.join(', ')}${more}` };
}

/**
 * Names are unique per study without regard to case (the index uses NOCASE); looking first
 * turns the usual duplicate into a clean 409 (the index stays the backstop).
 */
export async function assertNameFree(
  manager: EntityManager,
  table: 'planned_visit' | 'study_group',
  row: { studyId: string; name: string; id: string },
): Promise<void> {
  const rows = (await manager.query(
    `SELECT 1 FROM "${table}" WHERE "studyId" = ? AND "name" = ? COLLATE NOCASE AND "id" <> ? LIMIT 1`,
    [row.studyId, row.name, row.id],
  )) as unknown[];
  if (rows.length > 0) throw new DuplicateRowError('duplicate');
}
