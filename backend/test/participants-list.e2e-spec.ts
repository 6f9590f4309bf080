/**
 * The participants list (GET /api/participants) with what each row shows of its visits: site
 * and group names, visit count, latest PAF and Δf, open flags and the latest visit's report.
 * Rows are written straight into a real SQLite file (as study-overview.e2e-spec.ts does), so
 * every figure has a known answer: the expected values below are the numbers written, picked
 * by the definition in shared/src/study-model.ts (newest visit by date with a current run),
 * not computed by the code under test. Scope: each role sees only what its rules allow.
 */
import { createHash, randomUUID } from 'node:crypto';
import request from 'supertest';
import type { Page, ParticipantListItem } from '@gyre/shared';
import { SqliteReadsService } from '../src/common/database/sqlite-reads.service';
import type { UserKey } from './helpers/seed';
import { useTestApp } from './helpers/test-app';
import { newestSettingsId, writeWithoutForeignKeys } from './helpers/sqlite-rows';

const at = (minute: number) => new Date(Date.UTC(2026, 0, 1, 0, minute)).toISOString();

describe('participants list', () => {
  const t = useTestApp();
  const ids: Record<string, string> = {};

  const list = async (user: UserKey, query: Record<string, string> = {}) => {
    const response = await request(t.url)
      .get('/api/participants')
      .query(query)
      .set(await t.authHeader(user));
    expect(response.status).toBe(200);
    return response.body as Page<ParticipantListItem>;
  };
  const row = (page: Page<ParticipantListItem>, code: string) => {
    const found = page.items.find((p) => p.code === code);
    if (found === undefined) throw new Error(`no row ${code}`);
    return found;
  };

  beforeAll(async () => {
    const study = t.seed.studies.A.id;
    const p1 = t.seed.participants.A1;
    const p2 = t.seed.participants.A2;
    const v1 = t.seed.visits.A1.id;
    const uploader = t.seed.users.technician.id;
    const analyst = t.seed.users.analyst.id;
    let minute = 1;
    const newest = await newestSettingsId(t, study);
    // The runs name jobs that are not written here: foreign keys off while these rows go in.
    await writeWithoutForeignKeys(t, async (tx) => {
      const q = (sql: string, params: unknown[]) => tx.query(sql, params);
      const settingsId = newest ?? randomUUID();
      if (newest === null) {
        await q(
          `INSERT INTO "analysis_settings" ("id", "studyId", "version", "valuesJson", "reason", "createdAt") VALUES (?, ?, 1, '{}', 'test', ?)`,
          [settingsId, study, at(0)],
        );
      }
      const group = randomUUID();
      await q(
        `INSERT INTO "study_group" ("id", "studyId", "name", "description", "createdAt", "updatedAt") VALUES (?, ?, 'Arm North', '', ?, ?)`,
        [group, study, at(0), at(0)],
      );
      await q(`UPDATE "participant" SET "groupId" = ? WHERE "id" = ?`, [group, p1.id]);
      const visit = async (label: string, date: string) => {
        const id = randomUUID();
        await q(
          `INSERT INTO "visit" ("id", "participantId", "studyId", "siteId", "label", "plannedVisitId", "visitDate", "createdAt", "updatedAt") VALUES (?, ?, ?, ?, ?, NULL, ?, ?, ?)`,
          [id, p1.id, study, p1.siteId, label, date, at(0), at(0)],
        );
        return id;
      };
      // A1-0001: V1 (seed, 2026-01-15), V2 (2026-03-01), V3 (2026-05-01, nothing uploaded).
      const v2 = await visit('V2', '2026-03-01');
      const v3 = await visit('V3', '2026-05-01');
      Object.assign(ids, { v1, v2, v3 });
      const recording = async (
        p: { id: string; siteId: string },
        visitId: string,
        kind: 'resting' | 'task',
        state: string,
        numbers: { pafHz?: number; deltaFHz?: number },
      ) => {
        const recordingId = randomUUID();
        const runId = randomUUID();
        const createdAt = at(minute++);
        await q(
          `INSERT INTO "recording" ("id", "studyId", "siteId", "participantId", "visitId", "kind", "state", "checksumSha256", "sizeBytes", "uploadedById", "rejectionJson", "supersededById", "createdAt", "updatedAt", "latestRunId") VALUES (?, ?, ?, ?, ?, ?, ?, ?, 1, ?, NULL, ?, ?, ?, ?)`,
          [
            recordingId,
            study,
            p.siteId,
            p.id,
            visitId,
            kind,
            state,
            createHash('sha256').update(recordingId).digest('hex'),
            uploader,
            state === 'superseded' ? randomUUID() : null,
            createdAt,
            createdAt,
            runId,
          ],
        );
        await q(
          `INSERT INTO "analysis_run" ("id", "recordingId", "visitId", "participantId", "studyId", "siteId", "jobId", "kind", "trigger", "settingsId", "settingsVersion", "settingsJson", "codeVersion", "inputChecksumSha256", "bandLowHz", "bandHighHz", "bandSource", "roiDeltaFHz", "pafHz", "cogHz", "suggestsSlowing", "summaryJson", "series", "createdAt")
           VALUES (?, ?, ?, ?, ?, ?, ?, ?, 'upload', ?, 1, '{}', 'test', ?, 8, 12, 'iaf', ?, ?, NULL, 0, '{}', x'', ?)`,
          [
            runId,
            recordingId,
            visitId,
            p.id,
            study,
            p.siteId,
            randomUUID(),
            kind,
            settingsId,
            '0'.repeat(64),
            numbers.deltaFHz ?? null,
            numbers.pafHz ?? null,
            createdAt,
          ],
        );
      };
      await recording(p1, v1, 'resting', 'ready', { pafHz: 10.125 });
      await recording(p1, v1, 'task', 'ready', { deltaFHz: -0.3125 });
      // V2: a newer PAF; its task was replaced, so the superseded run's Δf never counts.
      await recording(p1, v2, 'resting', 'ready', { pafHz: 9.625 });
      await recording(p1, v2, 'task', 'superseded', { deltaFHz: -0.875 });
      // A2-0001: one visit, a resting recording computing again (its last run still current).
      await recording(p2, t.seed.visits.A2.id, 'resting', 'computing', { pafHz: 11.25 });
      const flag = async (
        p: { id: string; siteId: string },
        visitId: string,
        state: 'raised' | 'cleared',
      ) =>
        q(
          `INSERT INTO "flag" ("id", "visitId", "participantId", "studyId", "siteId", "state", "raisedById", "raiseReason", "raisedAt", "suggestionJson", "clearedById", "clearReason", "clearedAt") VALUES (?, ?, ?, ?, ?, ?, ?, 'slowing of the alpha onset', ?, NULL, ?, ?, ?)`,
          [
            randomUUID(),
            visitId,
            p.id,
            study,
            p.siteId,
            state,
            analyst,
            at(minute++),
            state === 'cleared' ? analyst : null,
            state === 'cleared' ? 'an artefact, not slowing' : null,
            state === 'cleared' ? at(minute++) : null,
          ],
        );
      await flag(p1, v1, 'raised');
      await flag(p1, v1, 'cleared');
      await flag(p1, v2, 'raised');
      await flag(p2, t.seed.visits.A2.id, 'raised');
      // The latest visit V3's report: revision 1 signed; V1's report is only a draft.
      const report = async (visitId: string, state: string, revisions: number) => {
        const reportId = randomUUID();
        await q(
          `INSERT INTO "report" ("id", "visitId", "participantId", "studyId", "siteId", "state", "createdAt", "updatedAt") VALUES (?, ?, ?, ?, ?, ?, ?, ?)`,
          [reportId, visitId, p1.id, study, p1.siteId, state, at(0), at(0)],
        );
        for (let revision = 1; revision <= revisions; revision++) {
          await q(
            `INSERT INTO "report_revision" ("id", "reportId", "visitId", "participantId", "studyId", "siteId", "revision", "state", "signedById", "signerName", "signerEmail", "signedAt", "meaning", "contentFingerprint", "pdfSha256", "pdfSizeBytes") VALUES (?, ?, ?, ?, ?, ?, ?, 'signed', ?, 'Signer', 'signer@example.org', ?, 'Reviewed', ?, ?, 1)`,
            [
              randomUUID(),
              reportId,
              visitId,
              p1.id,
              study,
              p1.siteId,
              revision,
              analyst,
              at(minute++),
              '0'.repeat(64),
              '0'.repeat(64),
            ],
          );
        }
      };
      await report(v1, 'draft', 0);
      await report(v3, 'signed', 1);
    });
  });

  it('gives an analyst every row of the study with names, counts and latest values', async () => {
    const page = await list('analyst');
    expect(page.items.map((p) => p.code)).toEqual(['A1-0001', 'A2-0001']);
    const first = row(page, 'A1-0001');
    expect(first).toMatchObject({
      siteName: 'Site A1',
      groupName: 'Arm North',
      visitCount: 3,
      // The newest visit with a current resting run is V2 (9.625 Hz), not V1 (10.125 Hz).
      latestPaf: { hz: 9.625, visitId: ids.v2, visitLabel: 'V2' },
      // V2's task recording was superseded: the latest current Δf is V1's.
      latestDeltaF: { hz: -0.3125, visitId: ids.v1, visitLabel: 'V1' },
      // Two raised, one cleared.
      openFlags: 2,
      latestVisit: {
        id: ids.v3,
        label: 'V3',
        visitDate: '2026-05-01',
        report: { state: 'signed', latestRevision: 1 },
      },
    });
    expect(row(page, 'A2-0001')).toMatchObject({
      siteName: 'Site A2',
      groupName: null,
      visitCount: 1,
      // A recording computing again keeps its last run as the current numbers.
      latestPaf: { hz: 11.25, visitLabel: 'V1' },
      latestDeltaF: null,
      openFlags: 1,
      latestVisit: { label: 'V1', report: null },
    });
  });

  it('scopes a technician to the site and leaves out results, flags and reports', async () => {
    const page = await list('technician');
    expect(page.total).toBe(1);
    expect(page.items).toHaveLength(1);
    expect(page.items[0]).toMatchObject({
      code: 'A1-0001',
      siteName: 'Site A1',
      visitCount: 3,
      latestPaf: null,
      latestDeltaF: null,
      openFlags: null,
      latestVisit: { id: ids.v3, report: null },
    });
    const other = await list('technicianA2');
    expect(other.items.map((p) => [p.code, p.visitCount, p.openFlags])).toEqual([
      ['A2-0001', 1, null],
    ]);
  });

  it("shows a coordinator their site's signed report but no results", async () => {
    const page = await list('coordinator');
    expect(page.items.map((p) => p.code)).toEqual(['A1-0001']);
    expect(page.items[0]).toMatchObject({
      latestPaf: null,
      openFlags: null,
      latestVisit: { report: { state: 'signed', latestRevision: 1 } },
    });
  });

  it('reads a fixed number of statements per page, whatever its size (never one per row)', async () => {
    const reads = t.app.get(SqliteReadsService);
    const all = jest.spyOn(reads, 'all');
    const one = jest.spyOn(reads, 'one');
    const statementsFor = async (pageSize: string) => {
      await t.authHeader('monitor'); // signed in before counting
      all.mockClear();
      one.mockClear();
      const page = await list('monitor', { pageSize });
      return { rows: page.items.length, statements: all.mock.calls.length + one.mock.calls.length };
    };
    try {
      const small = await statementsFor('1');
      const large = await statementsFor('2');
      expect([small.rows, large.rows]).toEqual([1, 2]);
      expect(large.statements).toBe(small.statements);
      // For the record (not a check): the mean time of the whole request on this machine.
      const header = await t.authHeader('monitor');
      const started = performance.now();
      for (let i = 0; i < 50; i++) {
        await request(t.url).get('/api/participants').set(header).expect(200);
      }
      console.log(
        `GET /api/participants (2 rows with extras): ${((performance.now() - started) / 50).toFixed(2)} ms per request, ${large.statements} statements`,
      );
    } finally {
      all.mockRestore();
      one.mockRestore();
    }
  });

  it('keeps filtering and sorting, with the same fields on every row', async () => {
    const bySite = await list('monitor', { siteId: t.seed.sites.A2.id });
    expect(bySite.items.map((p) => [p.code, p.siteName, p.openFlags])).toEqual([
      ['A2-0001', 'Site A2', 1],
    ]);
    const byCode = await list('monitor', { q: 'a1-' });
    expect(byCode.items.map((p) => [p.code, p.visitCount])).toEqual([['A1-0001', 3]]);
    const desc = await list('monitor', { sort: 'code', order: 'desc' });
    expect(desc.items.map((p) => p.code)).toEqual(['A2-0001', 'A1-0001']);
    expect(desc.items[1].latestPaf?.hz).toBe(9.625);
    const empty = await list('monitor', { q: 'ZZ-9' });
    expect(empty).toMatchObject({ total: 0, items: [] });
  });
});
