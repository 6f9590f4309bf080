/**
 * The study overview (GET /api/studies/:studyId/overview) on rows written straight into a
 * real SQLite file: planned visits, groups, participants at two sites, visits, recordings with
 * runs, reviews and signed reports, chosen so that every completion state, each doubt and the
 * group and site statistics have a known answer. The means and intervals are checked against
 * numpy and scipy.stats.t.interval (python3); a few hundred participants check the cost.
 */
import { createHash, randomUUID } from 'node:crypto';
import { execFileSync } from 'node:child_process';
import request from 'supertest';
import type { OverviewCell, OverviewStat, StudyOverviewView } from '@gyre/shared';
import { defineAbilityFor } from '@gyre/shared';
import type { Caller } from '../src/auth/decorators';
import { StudyOverviewService } from '../src/study-overview/study-overview.service';
import { type TestApp, useTestApp } from './helpers/test-app';
import { newestSettingsId, writeWithoutForeignKeys } from './helpers/sqlite-rows';

/** The seeded monitor of study B as the rules see them. */
function monitorB(t: TestApp) {
  const user = t.seed.users.monitorB;
  return { id: user.id, role: 'monitor' as const, studyId: t.seed.studies.B.id, siteId: null };
}

type Tx = { query: (sql: string, params?: unknown[]) => Promise<unknown> };

/** numpy mean and scipy.stats.t.interval(0.95, n − 1, mean, s/√n): the reference interval. */
function scipyInterval(values: number[]): [number, number, number] {
  const script = `import json,sys\nimport numpy as np\nfrom scipy import stats\na=np.array(json.load(sys.stdin)); m=a.mean(); s=a.std(ddof=1)\nlo,hi=stats.t.interval(0.95,len(a)-1,loc=m,scale=s/np.sqrt(len(a)))\nprint(json.dumps([float(m),float(lo),float(hi)]))`;
  const out = execFileSync('python3', ['-c', script], { input: JSON.stringify(values) });
  return JSON.parse(out.toString()) as [number, number, number];
}

const at = (minute: number) => new Date(Date.UTC(2026, 0, 1, 0, minute)).toISOString();

interface Ids {
  studyId: string;
  siteId: string;
  uploader: string;
}

/** Writes the rows of the scenario; returns ids by name. */
class Writer {
  private minute = 0;
  constructor(
    private readonly tx: Tx,
    private readonly ids: Ids,
  ) {}
  next(): string {
    return at(this.minute++);
  }
  async plannedVisit(name: string, targetDay: number, position: number): Promise<string> {
    const id = randomUUID();
    await this.tx.query(
      `INSERT INTO "planned_visit" ("id", "studyId", "name", "targetDay", "windowBeforeDays", "windowAfterDays", "position", "createdAt", "updatedAt") VALUES (?, ?, ?, ?, 14, 14, ?, ?, ?)`,
      [id, this.ids.studyId, name, targetDay, position, at(0), at(0)],
    );
    return id;
  }
  async group(name: string): Promise<string> {
    const id = randomUUID();
    await this.tx.query(
      `INSERT INTO "study_group" ("id", "studyId", "name", "description", "createdAt", "updatedAt") VALUES (?, ?, ?, '', ?, ?)`,
      [id, this.ids.studyId, name, at(0), at(0)],
    );
    return id;
  }
  async participant(siteId: string, code: string, groupId: string | null): Promise<string> {
    const id = randomUUID();
    await this.tx.query(
      `INSERT INTO "participant" ("id", "studyId", "siteId", "code", "enrolmentDate", "groupId", "createdAt", "updatedAt") VALUES (?, ?, ?, ?, '2026-01-01', ?, ?, ?)`,
      [id, this.ids.studyId, siteId, code, groupId, at(0), at(0)],
    );
    return id;
  }
  async visit(
    participantId: string,
    siteId: string,
    plannedVisitId: string | null,
    date: string,
  ): Promise<string> {
    const id = randomUUID();
    await this.tx.query(
      `INSERT INTO "visit" ("id", "participantId", "studyId", "siteId", "label", "plannedVisitId", "visitDate", "createdAt", "updatedAt") VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      [
        id,
        participantId,
        this.ids.studyId,
        siteId,
        `V ${date}`,
        plannedVisitId,
        date,
        at(0),
        at(0),
      ],
    );
    return id;
  }
  /** A recording; with `run`, a current one with a run holding these numbers. */
  async recording(
    visit: { id: string; participantId: string; siteId: string },
    kind: 'resting' | 'task',
    state: string,
    run?: {
      pafHz?: number | null;
      cogHz?: number | null;
      deltaFHz?: number | null;
      bandSource?: string;
      settingsId: string;
      quality?: Record<string, number | null>;
      roi?: { status: string; wanted: number; used: number };
    },
  ): Promise<{ recordingId: string; runId: string | null; createdAt: string }> {
    const recordingId = randomUUID();
    const runId = run === undefined ? null : randomUUID();
    const createdAt = this.next();
    await this.tx.query(
      `INSERT INTO "recording" ("id", "studyId", "siteId", "participantId", "visitId", "kind", "state", "checksumSha256", "sizeBytes", "uploadedById", "rejectionJson", "supersededById", "createdAt", "updatedAt", "latestRunId") VALUES (?, ?, ?, ?, ?, ?, ?, ?, 1, ?, ?, ?, ?, ?, ?)`,
      [
        recordingId,
        this.ids.studyId,
        visit.siteId,
        visit.participantId,
        visit.id,
        kind,
        state,
        createHash('sha256').update(recordingId).digest('hex'),
        this.ids.uploader,
        state === 'rejected' ? '{"message":"not an EDF file"}' : null,
        state === 'superseded' ? randomUUID() : null,
        createdAt,
        createdAt,
        runId,
      ],
    );
    if (run !== undefined && runId !== null) {
      const roi = run.roi ?? { status: 'full', wanted: 4, used: 4 };
      const label = (i: number) => `C${i}`;
      const summary = {
        quality: {
          epochsDroppedShare: null,
          phaseSlipShare: null,
          lineNoiseRatio50Hz: null,
          lineNoiseRatio60Hz: null,
          ...run.quality,
        },
        roiUsage: {
          status: roi.status,
          wanted: Array.from({ length: roi.wanted }, (_, i) => label(i)),
          used: Array.from({ length: roi.used }, (_, i) => label(i)),
          leftOut: [],
        },
      };
      await this.tx.query(
        `INSERT INTO "analysis_run" ("id", "recordingId", "visitId", "participantId", "studyId", "siteId", "jobId", "kind", "trigger", "settingsId", "settingsVersion", "settingsJson", "codeVersion", "inputChecksumSha256", "bandLowHz", "bandHighHz", "bandSource", "roiDeltaFHz", "pafHz", "cogHz", "suggestsSlowing", "summaryJson", "series", "createdAt")
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, 'upload', ?, 1, '{}', 'test', ?, 8, 12, ?, ?, ?, ?, 0, ?, x'', ?)`,
        [
          runId,
          recordingId,
          visit.id,
          visit.participantId,
          this.ids.studyId,
          visit.siteId,
          randomUUID(),
          kind,
          run.settingsId,
          '0'.repeat(64),
          run.bandSource ?? 'iaf',
          run.deltaFHz ?? null,
          run.pafHz ?? null,
          run.cogHz ?? null,
          JSON.stringify(summary),
          createdAt,
        ],
      );
    }
    return { recordingId, runId, createdAt };
  }
  async review(
    visit: { id: string; participantId: string; siteId: string },
    runs: Array<{ kind: string; runId: string | null }>,
    reviewerId: string,
  ): Promise<void> {
    const ids = runs.map((r) => `${r.kind}:${r.runId}`).sort();
    await this.tx.query(
      `INSERT INTO "visit_review" ("id", "visitId", "participantId", "studyId", "siteId", "reviewedById", "reviewedByName", "reviewedAt", "fingerprint", "runIdsJson") VALUES (?, ?, ?, ?, ?, ?, 'Reviewer', ?, ?, ?)`,
      [
        randomUUID(),
        visit.id,
        visit.participantId,
        this.ids.studyId,
        visit.siteId,
        reviewerId,
        this.next(),
        createHash('sha256').update(ids.join('\n')).digest('hex'),
        JSON.stringify(ids),
      ],
    );
  }
  /** A signed report of the visit, signed at `signedAt`. */
  async signedReport(
    visit: { id: string; participantId: string; siteId: string },
    signerId: string,
    signedAt: string,
  ): Promise<void> {
    const reportId = randomUUID();
    await this.tx.query(
      `INSERT INTO "report" ("id", "visitId", "participantId", "studyId", "siteId", "state", "createdAt", "updatedAt") VALUES (?, ?, ?, ?, ?, 'signed', ?, ?)`,
      [reportId, visit.id, visit.participantId, this.ids.studyId, visit.siteId, signedAt, signedAt],
    );
    await this.tx.query(
      `INSERT INTO "report_revision" ("id", "reportId", "visitId", "participantId", "studyId", "siteId", "revision", "state", "signedById", "signerName", "signerEmail", "signedAt", "meaning", "contentFingerprint", "pdfSha256", "pdfSizeBytes") VALUES (?, ?, ?, ?, ?, ?, 1, 'signed', ?, 'Signer', 'signer@example.org', ?, 'Reviewed', ?, ?, 1)`,
      [
        randomUUID(),
        reportId,
        visit.id,
        visit.participantId,
        this.ids.studyId,
        visit.siteId,
        signerId,
        signedAt,
        '0'.repeat(64),
        '0'.repeat(64),
      ],
    );
  }
}

describe('study overview', () => {
  const t = useTestApp();
  const s: Record<string, string> = {};

  beforeAll(async () => {
    const studyId = t.seed.studies.A.id;
    const A1 = t.seed.sites.A1.id;
    const A2 = t.seed.sites.A2.id;
    s.studyId = studyId;
    s.A1 = A1;
    s.A2 = A2;
    const analyst = t.seed.users.analyst.id;
    const newest = await newestSettingsId(t, studyId);
    // The runs name jobs (and an old settings version) that are not written here: only the
    // columns the overview reads matter, so the foreign keys are off while these rows go in.
    await writeWithoutForeignKeys(t, async (tx) => {
      const w = new Writer(tx, { studyId, siteId: A1, uploader: t.seed.users.technician.id });
      let current = newest;
      if (current === null) {
        current = randomUUID();
        await tx.query(
          `INSERT INTO "analysis_settings" ("id", "studyId", "version", "valuesJson", "reason", "createdAt") VALUES (?, ?, 1, '{}', 'test', ?)`,
          [current, studyId, at(0)],
        );
      }
      const old = randomUUID();
      const pv1 = await w.plannedVisit('Baseline', 0, 0);
      const pv2 = await w.plannedVisit('Month 6', 182, 1);
      const g1 = await w.group('Arm 1');
      const g2 = await w.group('Arm 2');
      Object.assign(s, { pv1, pv2, g1, g2 });
      const V = async (p: string, site: string, pv: string | null, date: string) => ({
        id: await w.visit(p, site, pv, date),
        participantId: p,
        siteId: site,
      });
      // A ready resting recording computed under the current settings (unless said otherwise).
      const rest = (
        visit: Awaited<ReturnType<typeof V>>,
        pafHz: number,
        cogHz: number,
        more: { settingsId?: string; quality?: Record<string, number> } = {},
      ) => w.recording(visit, 'resting', 'ready', { pafHz, cogHz, settingsId: current, ...more });
      // P1 (A1, Arm 1): Baseline computed; Month 6 reviewed.
      const p1 = await w.participant(A1, 'OV-01', g1);
      const p1v1 = await V(p1, A1, pv1, '2026-01-02');
      await rest(p1v1, 10.0, 9.8, { quality: { lineNoiseRatio50Hz: 0.2 } });
      await w.recording(p1v1, 'task', 'ready', {
        deltaFHz: -0.2,
        settingsId: current,
        quality: { epochsDroppedShare: 0.1, phaseSlipShare: 0.02, lineNoiseRatio50Hz: 0.4 },
        roi: { status: 'partial', wanted: 4, used: 3 },
      });
      const p1v2 = await V(p1, A1, pv2, '2026-07-01');
      const r = await rest(p1v2, 9.8, 9.7);
      await w.review(p1v2, [{ kind: 'resting', runId: r.runId }], analyst);
      // P2 (A1, Arm 1): Baseline signed; Month 6 signed, then a newer run.
      const p2 = await w.participant(A1, 'OV-02', g1);
      const p2v1 = await V(p2, A1, pv1, '2026-01-03');
      const r2 = await rest(p2v1, 10.4, 10.1);
      await w.signedReport(p2v1, analyst, w.next());
      const p2v2 = await V(p2, A1, pv2, '2026-07-02');
      await w.signedReport(p2v2, analyst, w.next());
      await rest(p2v2, 10.1, 10.0);
      s.p2v1Run = r2.runId as string;
      // P3 (A1, Arm 2): Baseline uploaded (queued, no run yet); a superseded upload; Month 6 missing.
      const p3 = await w.participant(A1, 'OV-03', g2);
      const p3v1 = await V(p3, A1, pv1, '2026-01-04');
      await w.recording(p3v1, 'resting', 'superseded');
      await w.recording(p3v1, 'resting', 'queued');
      // P4 (A2, Arm 1): Baseline computed with Δf in the default band; Month 6 registered, no recording.
      const p4 = await w.participant(A2, 'OV-04', g1);
      const p4v1 = await V(p4, A2, pv1, '2026-01-05');
      await rest(p4v1, 9.6, 9.5, { quality: { lineNoiseRatio50Hz: 1.0 } });
      await w.recording(p4v1, 'task', 'ready', {
        deltaFHz: -0.5,
        bandSource: 'default',
        settingsId: current,
        quality: { epochsDroppedShare: 0.3, phaseSlipShare: 0.06, lineNoiseRatio50Hz: 1.2 },
        roi: { status: 'none', wanted: 4, used: 0 },
      });
      await w.recording(p4v1, 'task', 'rejected');
      await V(p4, A2, pv2, '2026-07-05');
      // P5 (A2, no group): Baseline from an older settings version; one unplanned visit.
      const p5 = await w.participant(A2, 'OV-05', null);
      const p5v1 = await V(p5, A2, pv1, '2026-01-06');
      await rest(p5v1, 9.9, 9.6, { settingsId: old });
      await V(p5, A2, null, '2026-03-01');
      Object.assign(s, { p1, p2, p3, p4, p5 });
    });
  }, 120_000);

  const get = async (user: Parameters<TestApp['authHeader']>[0], studyId = s.studyId) =>
    request(t.url)
      .get(`/api/studies/${studyId}/overview`)
      .set(await t.authHeader(user));

  const cell = (o: StudyOverviewView, participantId: string, pv: string): OverviewCell => {
    const found = o.participants
      .find((p) => p.id === participantId)
      ?.cells.find((c) => c.plannedVisitId === pv);
    if (found === undefined) throw new Error('no cell');
    return found;
  };
  const stat = (
    list: OverviewStat[],
    measure: string,
    pv: string,
    key: string | null,
  ): OverviewStat | undefined =>
    list.find((x) => x.measure === measure && x.plannedVisitId === pv && x.key === key);

  /** n, mean (12 digits) and the 95 % interval (9 digits) of `values` as scipy computes them. */
  const expectScipyInterval = (found: OverviewStat | undefined, values: number[]) => {
    const [mean, low, high] = scipyInterval(values);
    expect(found?.n).toBe(values.length);
    expect(found?.mean).toBeCloseTo(mean, 12);
    expect(found?.ciLow).toBeCloseTo(low, 9);
    expect(found?.ciHigh).toBeCloseTo(high, 9);
  };

  it('fills the completion matrix with the five states as docs/user-guide.md defines them', async () => {
    const response = await get('monitor');
    expect(response.status).toBe(200);
    const o = response.body as StudyOverviewView;
    expect(o.plannedVisits.map((p) => p.name)).toEqual(['Baseline', 'Month 6']);
    const states = (id: string) => [cell(o, id, s.pv1).state, cell(o, id, s.pv2).state];
    expect(states(s.p1)).toEqual(['computed', 'reviewed']);
    expect(states(s.p2)).toEqual(['signed', 'computed']);
    expect(cell(o, s.p2, s.pv2).changedSinceSigning).toBe(true);
    expect(cell(o, s.p2, s.pv1).changedSinceSigning).toBe(false);
    expect(states(s.p3)).toEqual(['uploaded', 'missing']);
    expect(states(s.p4)).toEqual(['computed', 'missing']);
    // A registered visit without a recording is missing, but names its visit.
    expect(cell(o, s.p4, s.pv2).visitId).not.toBeNull();
    expect(cell(o, s.p3, s.pv2).visitId).toBeNull();
    expect(states(s.p5)).toEqual(['computed', 'missing']);
    // The seed's participants have only an unplanned visit each.
    const seeded = o.participants.find((p) => p.id === t.seed.participants.A1.id);
    expect(seeded?.cells.map((c) => c.state)).toEqual(['missing', 'missing']);
    expect(seeded?.unplannedVisits).toBe(1);
  });

  it('says which numbers are doubtful, per visit and study-wide', async () => {
    const o = (await get('analyst')).body as StudyOverviewView;
    expect(cell(o, s.p4, s.pv1).doubts).toEqual(
      expect.arrayContaining([
        expect.stringMatching(/no resting IAF/),
        expect.stringMatching(/No region-of-interest channel/),
      ]),
    );
    expect(cell(o, s.p5, s.pv1).doubts).toEqual([expect.stringMatching(/older than/)]);
    expect(cell(o, s.p1, s.pv1).doubts).toEqual([expect.stringMatching(/incomplete/)]);
    expect(cell(o, s.p1, s.pv2).doubts).toEqual([]);
    expect(o.notes).toEqual(
      expect.arrayContaining([
        '1 visit used the 8–13 Hz band for Δf because the visit has no resting IAF.',
        '1 visit was computed with settings older than the current ones.',
        '1 signed visit has results newer than the signature.',
        '3 visits are on no planned visit and are not in these numbers.',
      ]),
    );
  });

  it('gives n, mean and the 95 % Student t interval per group and site, as scipy does', async () => {
    const o = (await get('admin')).body as StudyOverviewView;
    // Arm 1 at Baseline: P1 10.0, P2 10.4, P4 9.6 (P4's PAF itself is not in doubt, its Δf is).
    const arm1 = stat(o.byGroup, 'paf', s.pv1, s.g1);
    expectScipyInterval(arm1, [10.0, 10.4, 9.6]);
    expect(arm1?.doubtful).toBe(2); // P1 (partial ROI) and P4 carry a doubt
    // Arm 2 at Baseline: nothing computed yet.
    expect(stat(o.byGroup, 'paf', s.pv1, s.g2)).toMatchObject({ n: 0, mean: null, ciLow: null });
    // No group: P5 alone: a mean, no interval.
    expect(stat(o.byGroup, 'cog', s.pv1, null)).toMatchObject({ n: 1, mean: 9.6, ciLow: null });
    // By site, Month 6 PAF at A1: P1 9.8 and P2 10.1.
    expectScipyInterval(stat(o.bySite, 'paf', s.pv2, s.A1), [9.8, 10.1]);
    // Δf at Baseline in Arm 1: P1 −0.2 and P4 −0.5.
    expectScipyInterval(stat(o.byGroup, 'deltaF', s.pv1, s.g1), [-0.2, -0.5]);
    expect(cell(o, s.p1, s.pv1)).toMatchObject({ paf: 10.0, cog: 9.8, deltaF: -0.2 });
  });

  it('compares site quality: rejection rate, epochs dropped, line noise, phase slips, ROI channels lost', async () => {
    const o = (await get('monitor')).body as StudyOverviewView;
    /** The site's counts and shares exactly; its two averages to 12 digits. */
    const expectSite = (id: string, exact: object, lineNoise: number, roiLost: number) => {
      const site = o.siteQuality.find((q) => q.siteId === id);
      expect(site).toMatchObject(exact);
      expect(site?.lineNoiseRatio50Hz).toBeCloseTo(lineNoise, 12);
      expect(site?.roiChannelsLost).toBeCloseTo(roiLost, 12);
    };
    // A1: 6 overview uploads + the seed's none; P3's superseded one counts as an upload.
    // Line noise over runs that report it: (0.2 + 0.4) / 2; ROI channels lost (1 + 0·4) / 5.
    expectSite(
      s.A1,
      {
        uploads: 7,
        rejected: 0,
        rejectionRate: 0,
        runs: 5,
        epochsDroppedShare: 0.1,
        phaseSlipShare: 0.02,
        runsWithoutRoi: 0,
      },
      0.3,
      1 / 5,
    );
    expectSite(
      s.A2,
      {
        uploads: 4,
        rejected: 1,
        rejectionRate: 0.25,
        runs: 3,
        epochsDroppedShare: 0.3,
        runsWithoutRoi: 1,
      },
      1.1,
      4 / 3,
    );
  });

  it('answers 404 outside the caller’s study, 403 to roles without it, 400 for a bad id', async () => {
    expect((await get('monitorB')).status).toBe(404);
    expect((await get('analystB')).body.code).toBe('STUDY_OVERVIEW_STUDY_NOT_FOUND');
    expect((await get('technician')).status).toBe(403);
    expect((await get('coordinator')).status).toBe(403);
    expect((await get('admin', randomUUID())).status).toBe(404);
    const bad = await get('admin', 'not-a-uuid');
    expect(bad.status).toBe(400);
    expect((await get('monitorB', t.seed.studies.B.id)).status).toBe(200);
  });
});

describe('study overview over a few hundred participants', () => {
  const t = useTestApp();
  const PARTICIPANTS = 300;
  const PLANNED = 3;

  /** Study B: 300 participants in two groups, three planned visits, a resting and a task run each. */
  beforeAll(async () => {
    const studyId = t.seed.studies.B.id;
    const site = t.seed.sites.B1.id;
    // A summary about the size of a 64-channel run's (its per-channel statistics), so that the
    // JSON reads cost what they cost in use.
    const channels = Array.from({ length: 64 }, (_, i) => ({
      label: `E${i}`,
      baselineHz: 10.123456789,
      postHz: 9.876543211,
      deltaFHz: -0.246913578,
      ciHz: [-0.3012345, -0.1912345],
      pValue: 0.00123456,
      trialsKept: 58,
      lineNoiseRatio50Hz: 0.123456,
      flat: false,
      saturated: false,
    }));
    await writeWithoutForeignKeys(t, async (tx) => {
      const w = new Writer(tx, { studyId, siteId: site, uploader: t.seed.users.technicianB.id });
      const groups = [await w.group('Arm 1'), await w.group('Arm 2')];
      const planned: string[] = [];
      for (let k = 0; k < PLANNED; k++) planned.push(await w.plannedVisit(`PV${k}`, k * 90, k));
      for (let i = 0; i < PARTICIPANTS; i++) {
        const p = await w.participant(site, `BX-${String(i).padStart(4, '0')}`, groups[i % 2]);
        for (let k = 0; k < PLANNED; k++) {
          const date = `2026-0${1 + k * 3}-1${k}`;
          const visit = {
            id: await w.visit(p, site, planned[k], date),
            participantId: p,
            siteId: site,
          };
          for (const kind of ['resting', 'task'] as const) {
            const rec = await w.recording(visit, kind, 'ready', {
              pafHz: kind === 'resting' ? 10 - k * 0.1 + (i % 7) * 0.05 : null,
              cogHz: kind === 'resting' ? 9.8 - k * 0.1 : null,
              deltaFHz: kind === 'task' ? -0.3 - (i % 5) * 0.02 : null,
              settingsId: 'old',
              quality: { lineNoiseRatio50Hz: 0.2, epochsDroppedShare: 0.05, phaseSlipShare: 0.01 },
            });
            await tx.query(
              `UPDATE "analysis_run" SET "summaryJson" = json_set("summaryJson", '$.channels', json(?)) WHERE "id" = ?`,
              [JSON.stringify(channels), rec.runId],
            );
          }
        }
      }
    });
  }, 300_000);

  it('answers in bounded time with every participant and cell', async () => {
    const header = await t.authHeader('monitorB');
    const url = `/api/studies/${t.seed.studies.B.id}/overview`;
    await request(t.url).get(url).set(header); // warm the statements and the token
    const times: number[] = [];
    let body: StudyOverviewView | null = null;
    for (let i = 0; i < 5; i++) {
      const started = process.hrtime.bigint();
      const response = await request(t.url).get(url).set(header);
      times.push(Number(process.hrtime.bigint() - started) / 1e6);
      expect(response.status).toBe(200);
      body = response.body as StudyOverviewView;
    }
    const o = body as StudyOverviewView;
    // 300 seeded here + the seed's one participant of site B1.
    expect(o.participants).toHaveLength(PARTICIPANTS + 1);
    const states = o.participants.flatMap((p) => p.cells.map((c) => c.state));
    expect(states.filter((x) => x === 'computed')).toHaveLength(PARTICIPANTS * PLANNED);
    expect(o.byGroup.filter((x) => x.measure === 'paf' && x.n === PARTICIPANTS / 2)).toHaveLength(
      2 * PLANNED,
    );
    expect(o.siteQuality[0]).toMatchObject({ runs: PARTICIPANTS * PLANNED * 2 });
    times.sort((a, b) => a - b);
    const median = times[2];
    // The service alone (reads and sums, no HTTP, no JSON text): where the time goes.
    const service = t.app.get(StudyOverviewService);
    const caller = { ability: defineAbilityFor(monitorB(t)) } as unknown as Caller;
    const serviceTimes: number[] = [];
    for (let i = 0; i < 5; i++) {
      const started = process.hrtime.bigint();
      service.overview(caller, t.seed.studies.B.id);
      serviceTimes.push(Number(process.hrtime.bigint() - started) / 1e6);
    }
    serviceTimes.sort((a, b) => a - b);
    process.stderr.write(
      `study overview, ${PARTICIPANTS} participants × ${PLANNED} planned visits × 2 runs: median ${median.toFixed(0)} ms of 5 (${times.map((x) => x.toFixed(0)).join(', ')}); the service alone ${serviceTimes[2].toFixed(0)} ms\n`,
    );
    // Generous on a shared 2-core machine; a query per participant would be far beyond it.
    expect(median).toBeLessThan(3000);
  });
});
