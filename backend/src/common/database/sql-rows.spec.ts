import type { DataSource } from 'typeorm';
import { Participant } from '../../participants/participant.entity';
import { pageWindowOf } from '../pagination/page-query.dto';
import { SqlEntityRows, sqlPage } from './sql-rows';
import { SqliteReadsService } from './sqlite-reads.service';
import { participantTable, type ParticipantTable } from './testing/participant-table';

// A real SQLite file: the page and its count must come from SQL as TypeORM's findAndCount
// gives them (the reference here), for every page including one past the end.
describe('pages of entity rows by prepared statements', () => {
  let table: ParticipantTable;
  let db: DataSource;
  let reads: SqliteReadsService;
  let rows: SqlEntityRows<Participant>;

  beforeAll(async () => {
    table = await participantTable('sql-rows');
    db = table.db;
    // 23 rows, some sharing a creation time, so the order needs its tie-break on id.
    for (let i = 0; i < 23; i += 1) {
      await db.getRepository(Participant).insert({
        id: `p${String(i).padStart(2, '0')}`,
        studyId: 'S1',
        siteId: i % 3 === 0 ? 'B' : 'A',
        code: `A-${String(23 - i).padStart(4, '0')}`,
        enrolmentDate: i % 2 === 0 ? '2026-01-15' : null,
        groupId: null,
        createdAt: `2026-01-0${(i % 4) + 1}T00:00:00.000Z`,
        updatedAt: '2026-02-01T00:00:00.000Z',
      });
    }
    reads = new SqliteReadsService(db);
    rows = new SqlEntityRows<Participant>(db.getMetadata(Participant), db.driver, 'p');
  });
  afterAll(async () => {
    await table.close();
  });

  it.each([
    [1, 10, 'asc'],
    [2, 10, 'asc'],
    [3, 10, 'desc'],
    [4, 10, 'asc'],
    [1, 200, 'desc'],
  ] as const)(
    'page %i of %i (%s) by site A: the rows and total of findAndCount',
    async (page, pageSize, order) => {
      const window = pageWindowOf({ page, pageSize, order });
      const [expected, expectedTotal] = await db.getRepository(Participant).findAndCount({
        where: { siteId: 'A' },
        order: { createdAt: window.order, id: 'ASC' },
        skip: window.skip,
        take: window.take,
      });
      const [found, total] = sqlPage(
        reads,
        {
          columns: rows.columns,
          from: '"participant" p',
          where: [`p."siteId" = ?`],
          params: ['A'],
          orderBy: `p."createdAt" ${window.order}, p."id" ASC`,
        },
        window,
      );
      expect(total).toBe(expectedTotal);
      expect(total).toBe(15);
      expect(found.map((r) => rows.hydrate(r))).toEqual(expected.map((e) => ({ ...e })));
    },
  );

  it('a page with no match at all is empty with total 0', () => {
    const [found, total] = sqlPage(
      reads,
      {
        columns: rows.columns,
        from: '"participant" p',
        where: [`p."siteId" = ?`],
        params: ['Z'],
        orderBy: 'p."id"',
      },
      pageWindowOf({}),
    );
    expect([found, total]).toEqual([[], 0]);
  });
});
