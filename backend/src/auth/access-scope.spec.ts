import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { DataSource } from 'typeorm';
import { defineAbilityFor } from '@gyre/shared';
import { GyreException } from '../common/errors/gyre.exception';
import { Participant } from '../participants/participant.entity';
import { applyScope, membershipScope, scopedWhere } from './access-scope';

// A real SQLite file with just the participant table: the scope must work in SQL, not in JS.
describe('row scope in the query', () => {
  let dir: string;
  let db: DataSource;
  const tech = defineAbilityFor({ id: 'u1', role: 'technician', studyId: 'S1', siteId: 'A' });
  const analyst = defineAbilityFor({ id: 'u2', role: 'analyst', studyId: 'S1', siteId: null });
  const admin = defineAbilityFor({ id: 'u3', role: 'admin', studyId: null, siteId: null });

  beforeAll(async () => {
    dir = mkdtempSync(join(tmpdir(), 'gyre-scope-'));
    db = new DataSource({
      type: 'better-sqlite3',
      database: join(dir, 'scope.sqlite'),
      entities: [Participant],
    });
    await db.initialize();
    await db.query(
      `CREATE TABLE "participant" ("id" varchar PRIMARY KEY, "studyId" varchar, "siteId" varchar, "code" varchar, "createdAt" varchar, "updatedAt" varchar)`,
    );
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
    await db.destroy();
    rmSync(dir, { recursive: true, force: true });
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
  });

  it('membershipScope gives the plain study/site of a user', () => {
    expect(membershipScope({ studyId: 'S1', siteId: 'A' })).toEqual({ studyId: 'S1', siteId: 'A' });
    expect(membershipScope({ studyId: 'S1', siteId: null })).toEqual({ studyId: 'S1' });
    expect(membershipScope({ studyId: null, siteId: null })).toEqual({});
  });
});
