import type { DataSource } from 'typeorm';
import { defineAbilityFor } from '@gyre/shared';
import { GyreException } from '../common/errors/gyre.exception';
import { Participant } from '../participants/participant.entity';
import { sqliteHandleOf } from '../common/database/sqlite-handle';
import {
  participantTable,
  type ParticipantTable,
} from '../common/database/testing/participant-table';
import { applyScope, membershipScope, scopedWhere, scopeSql } from './access-scope';

// A real SQLite file with just the participant table: the scope must work in SQL, not in JS.
describe('row scope in the query', () => {
  let table: ParticipantTable;
  let db: DataSource;
  const tech = defineAbilityFor({ id: 'u1', role: 'technician', studyId: 'S1', siteId: 'A' });
  const analyst = defineAbilityFor({ id: 'u2', role: 'analyst', studyId: 'S1', siteId: null });
  const admin = defineAbilityFor({ id: 'u3', role: 'admin', studyId: null, siteId: null });

  beforeAll(async () => {
    table = await participantTable('scope');
    db = table.db;
    const at = '2026-01-01T00:00:00.000Z';
    for (const [id, studyId, siteId] of [
      ['p1', 'S1', 'A'],
      ['p2', 'S1', 'B'],
      ['p3', 'S2', 'C'],
    ]) {
      await db.getRepository(Participant).insert({
        id,
        studyId,
        siteId,
        code: `${id.toUpperCase()}-1`,
        createdAt: at,
        updatedAt: at,
      });
    }
  });
  afterAll(async () => {
    await table.close();
  });

  const ids = (rows: Participant[]) => rows.map((row) => row.id).sort();

  it('scopedWhere: technician own site, analyst own study', async () => {
    const repo = db.getRepository(Participant);
    expect(
      ids(await repo.find({ where: scopedWhere<Participant>(tech, 'read', 'Participant') })),
    ).toEqual(['p1']);
    expect(
      ids(await repo.find({ where: scopedWhere<Participant>(analyst, 'read', 'Participant') })),
    ).toEqual(['p1', 'p2']);
  });

  it('scopedWhere: an id outside the scope finds nothing, even when it names the column the scope uses', async () => {
    const repo = db.getRepository(Participant);
    expect(
      await repo.findOne({
        where: scopedWhere<Participant>(tech, 'read', 'Participant', { id: 'p2' }),
      }),
    ).toBeNull();
    expect(
      await repo.find({
        where: scopedWhere<Participant>(tech, 'read', 'Participant', { siteId: 'B' }),
      }),
    ).toEqual([]);
  });

  it('applyScope: the same scope through a query builder', async () => {
    const query = db.getRepository(Participant).createQueryBuilder('p');
    expect(ids(await applyScope(query, 'p', analyst, 'read', 'Participant').getMany())).toEqual([
      'p1',
      'p2',
    ]);
    const techQuery = db
      .getRepository(Participant)
      .createQueryBuilder('p')
      .where('p.code LIKE :c', { c: 'P%' });
    expect(ids(await applyScope(techQuery, 'p', tech, 'read', 'Participant').getMany())).toEqual([
      'p1',
    ]);
  });

  it('no rule at all is a 403, never an unfiltered query', () => {
    expect(() => scopedWhere<Participant>(admin, 'read', 'Participant')).toThrow(GyreException);
    expect(() => scopeSql(admin, 'read', 'Participant', 'p')).toThrow(GyreException);
  });

  it('scopeSql: the same rows as scopedWhere, in raw SQL with bound values', () => {
    const idsWhere = (ability: typeof tech, extra = '', extraParams: string[] = []): string[] => {
      const scope = scopeSql(ability, 'read', 'Participant', 'p');
      return (
        sqliteHandleOf(db)
          .prepare(`SELECT "id" FROM "participant" p WHERE ${scope.sql}${extra}`)
          .all(...scope.params, ...extraParams) as { id: string }[]
      )
        .map((row) => row.id)
        .sort();
    };
    expect(idsWhere(tech)).toEqual(['p1']);
    expect(idsWhere(analyst)).toEqual(['p1', 'p2']);
    // An id outside the scope finds nothing.
    expect(idsWhere(tech, ` AND p."id" = ?`, ['p2'])).toEqual([]);
    // Values are bound, never written into the text.
    const scope = scopeSql(tech, 'read', 'Participant', 'p');
    expect(scope.sql).toBe('((p."studyId" = ? AND p."siteId" = ?))');
    expect(scope.params).toEqual(['S1', 'A']);
    // A rule without conditions is the whole table.
    expect(scopeSql(admin, 'read', 'Study', 's')).toEqual({ sql: '1', params: [] });
  });

  it('scopeSql: $in conditions (a coordinator sees signed and sent reports of the site only)', () => {
    const coordinator = defineAbilityFor({
      id: 'u4',
      role: 'coordinator',
      studyId: 'S1',
      siteId: 'A',
    });
    const handle = sqliteHandleOf(db);
    handle
      .prepare(
        `CREATE TABLE IF NOT EXISTS "report_scope" ("id" varchar PRIMARY KEY, "studyId" varchar, "siteId" varchar, "state" varchar)`,
      )
      .run();
    const rows: [string, string, string, string][] = [
      ['r1', 'S1', 'A', 'signed'],
      ['r2', 'S1', 'A', 'draft'],
      ['r3', 'S1', 'A', 'sent'],
      ['r4', 'S1', 'B', 'signed'],
    ];
    for (const row of rows) {
      handle.prepare(`INSERT INTO "report_scope" VALUES (?, ?, ?, ?)`).run(...row);
    }
    const scope = scopeSql(coordinator, 'read', 'Report', 'r');
    const found = handle
      .prepare(`SELECT "id" FROM "report_scope" r WHERE ${scope.sql} ORDER BY "id"`)
      .all(...scope.params) as { id: string }[];
    expect(found.map((row) => row.id)).toEqual(['r1', 'r3']);
  });

  it('membershipScope gives the plain study/site of a user', () => {
    expect(membershipScope({ studyId: 'S1', siteId: 'A' })).toEqual({ studyId: 'S1', siteId: 'A' });
    expect(membershipScope({ studyId: 'S1', siteId: null })).toEqual({ studyId: 'S1' });
    expect(membershipScope({ studyId: null, siteId: null })).toEqual({});
  });
});
