/**
 * The visit-schedule migration on a database written by the version before it: studies,
 * participants and visits survive unchanged, the new columns are empty or take their
 * defaults, the constraints hold, and the migration can be undone.
 */
import { randomUUID } from 'node:crypto';
import type { DataSource } from 'typeorm';
import { VisitScheduleAndGroups1764700300000 } from '../src/database/migrations/1764700300000-visit-schedule-and-groups';
import { MigrationDatabase } from './helpers/migration-database';
import { seedDatabase } from './helpers/seed';

describe('migration VisitScheduleAndGroups1764700300000', () => {
  let db: MigrationDatabase;
  let dataSource: DataSource;
  let index: number;
  const q = (sql: string, params: unknown[] = []): Promise<unknown> => db.query(sql, params);

  beforeAll(async () => {
    db = await MigrationDatabase.before(VisitScheduleAndGroups1764700300000);
    ({ dataSource, index } = db);
  });
  afterAll(async () => {
    await db.close();
  });

  it('keeps the old rows, adds empty columns and defaults, and holds its constraints', async () => {
    expect(index).toBeGreaterThan(0);
    const seed = await seedDatabase(dataSource);
    const before = await q(`SELECT * FROM "visit" ORDER BY "id"`);

    expect(await db.migrate(index + 1)).toBe(true);

    expect(
      await q(`SELECT "code", "trendMinVisits", "trendMinSpanDays" FROM "study" ORDER BY "code"`),
    ).toEqual([
      { code: 'ALPHA', trendMinVisits: 3, trendMinSpanDays: 90 },
      { code: 'BETA', trendMinVisits: 3, trendMinSpanDays: 90 },
    ]);
    expect(
      await q(`SELECT "code", "enrolmentDate", "groupId" FROM "participant" ORDER BY "code"`),
    ).toEqual([
      { code: 'A1-0001', enrolmentDate: null, groupId: null },
      { code: 'A2-0001', enrolmentDate: null, groupId: null },
      { code: 'B1-0001', enrolmentDate: null, groupId: null },
    ]);
    const after = (await q(`SELECT * FROM "visit" ORDER BY "id"`)) as Record<string, unknown>[];
    expect(after.map(({ plannedVisitId, ...rest }) => ({ plannedVisitId, rest }))).toEqual(
      (before as Record<string, unknown>[]).map((rest) => ({ plannedVisitId: null, rest })),
    );
    expect(await q('PRAGMA foreign_key_check')).toEqual([]);

    const at = '2026-01-01T00:00:00.000Z';
    const study = seed.studies.A.id;
    const planned = randomUUID();
    const insertPlanned = (id: string, name: string, targetDay: number) =>
      q(`INSERT INTO "planned_visit" VALUES (?, ?, ?, ?, 7, 7, 0, ?, ?)`, [
        id,
        study,
        name,
        targetDay,
        at,
        at,
      ]);
    await insertPlanned(planned, 'Week 12', 84);
    // Names are unique per study whatever their case; days are never negative.
    await expect(insertPlanned(randomUUID(), 'WEEK 12', 90)).rejects.toThrow(/UNIQUE/);
    await expect(insertPlanned(randomUUID(), 'Before', -1)).rejects.toThrow(/CHECK/);
    await expect(
      q(`UPDATE "study" SET "trendMinVisits" = 1 WHERE "id" = ?`, [study]),
    ).rejects.toThrow(/CHECK/);
    // One visit per participant and planned visit; a group must exist.
    const visit = seed.visits.A1;
    await q(`UPDATE "visit" SET "plannedVisitId" = ? WHERE "id" = ?`, [planned, visit.id]);
    await expect(
      q(
        `INSERT INTO "visit" ("id", "participantId", "studyId", "siteId", "label", "visitDate", "createdAt", "updatedAt", "plannedVisitId") VALUES (?, ?, ?, ?, 'V2', '2026-04-01', ?, ?, ?)`,
        [randomUUID(), visit.participantId, visit.studyId, visit.siteId, at, at, planned],
      ),
    ).rejects.toThrow(/UNIQUE/);
    await expect(
      q(`UPDATE "participant" SET "groupId" = ? WHERE "id" = ?`, [
        randomUUID(),
        visit.participantId,
      ]),
    ).rejects.toThrow(/FOREIGN KEY/);
    // A planned visit a visit uses cannot be deleted under it.
    await expect(q(`DELETE FROM "planned_visit" WHERE "id" = ?`, [planned])).rejects.toThrow(
      /FOREIGN KEY/,
    );
  });

  it('can be undone, leaving the tables as they were', async () => {
    await q(`UPDATE "visit" SET "plannedVisitId" = NULL`);
    await q(`DELETE FROM "planned_visit"`);
    await dataSource.undoLastMigration({ transaction: 'each' });
    const columns = (table: string) =>
      (q(`PRAGMA table_info("${table}")`) as Promise<{ name: string }[]>).then((rows) =>
        rows.map((r) => r.name),
      );
    expect(await columns('participant')).not.toContain('enrolmentDate');
    expect(await columns('visit')).not.toContain('plannedVisitId');
    expect(await columns('study')).not.toContain('trendMinVisits');
    expect(await q(`SELECT name FROM sqlite_master WHERE name = 'planned_visit'`)).toEqual([]);
    expect(await q(`SELECT COUNT(*) AS n FROM "visit"`)).toEqual([{ n: 3 }]);
  });
});
