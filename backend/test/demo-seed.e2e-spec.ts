/**
 * The demo seeder end to end: the small demo study goes into a real, empty server through
 * the HTTP API (invitations over the local SMTP capture, multipart uploads by each site's
 * technician, the worker pool computing), and each participant's known answer comes back
 * through the API.
 *
 * Generated data: every recording is made by seed/'s generator; the "truth" is what it was
 * generated with (resting IAF per visit, post-onset Δf per visit, IAF drift per year), not a
 * measurement.
 */
import { statSync, readFileSync } from 'node:fs';
import request from 'supertest';
import type {
  ReportView,
  RecordingView,
  TrajectoryView,
  VisitFlagView,
  VisitReviewStateView,
  VisitView,
  WorklistView,
} from '@gyre/shared';
import { buildDemoScenario } from '../../seed/src/scenario/demo-scenario';
import { DemoSeedResult, seedDemo } from '../../seed/src/seeder/demo-seeder';
import { AccountsService } from '../src/accounts/accounts.service';
import { AuditService } from '../src/audit/audit.service';
import { PasswordHasherService } from '../src/auth/password-hasher.service';
import { DemoSeedService } from '../src/demo/demo-seed.service';
import { waitForMail } from './helpers/mail-catcher';
import { useTestApp } from './helpers/test-app';

const t = useTestApp({ seed: false });
let seeded: DemoSeedResult;
const tokens = new Map<string, string>();

async function tokenOf(role: string, siteKey: string | null = null): Promise<string> {
  const key = `${role}/${siteKey}`;
  const cached = tokens.get(key);
  if (cached !== undefined) return cached;
  const account = seeded.credentials.find((c) => c.role === role && c.siteKey === siteKey);
  if (account === undefined) throw new Error(`no demo ${role} for ${siteKey}`);
  const response = await request(t.url)
    .post('/api/auth/sign-in')
    .send({ email: account.email, password: account.password });
  expect(response.status).toBe(200);
  const token = (response.body as { accessToken: string }).accessToken;
  tokens.set(key, token);
  return token;
}

/** Runs the demo seeder's small study against this server, its first admin made in-process. */
function seedSmallDemo(): Promise<DemoSeedResult> {
  const demo = new DemoSeedService(
    t.dataSource,
    t.app.get(AuditService),
    new PasswordHasherService(t.config),
    t.app.get(AccountsService),
  );
  return seedDemo({
    baseUrl: t.url,
    dataDir: t.dataDir,
    signInUrl: t.config.publicUrl,
    scenario: buildDemoScenario('small'),
    createFirstAdmin: (input) => demo.createFirstAdmin(input),
    resultTimeoutMs: 8 * 60_000,
  });
}

beforeAll(async () => {
  seeded = await seedSmallDemo();
}, 10 * 60_000);

describe('demo seed (small version, generated data)', () => {
  it('seeds every upload, computes all but the one deliberately broken file', () => {
    expect(seeded.status).toBe('seeded');
    // 3 participants × 3 visits × 2 recordings, plus the cut-off task file, plus the resting
    // retake that replaced (superseded) a reviewed visit's first take.
    expect(seeded.recordingStates).toEqual({ ready: 18, rejected: 1, superseded: 1 });
  });

  it("gives back each participant's known answer: PAF within 0.1 Hz, Δf within 0.05 Hz, the IAF trend's sign", async () => {
    const analyst = await tokenOf('analyst');
    for (const participant of seeded.participants) {
      const response = await request(t.url)
        .get(`/api/participants/${participant.participantId}/trajectory`)
        .set('Authorization', `Bearer ${analyst}`);
      expect(response.status).toBe(200);
      const trajectory = response.body as TrajectoryView;
      expect(trajectory.visits).toHaveLength(participant.visits.length);
      for (const visit of participant.visits) {
        const measured = trajectory.visits.find((v) => v.visitId === visit.visitId);
        const where = `${participant.code} ${visit.label}`;
        expect({ where, paf: measured?.pafHz ?? null }).toEqual({ where, paf: expect.any(Number) });
        expect({
          where,
          pafError: Math.abs((measured?.pafHz ?? NaN) - visit.truth.iafHz) < 0.1,
        }).toEqual({
          where,
          pafError: true,
        });
        expect({
          where,
          deltaFError: Math.abs((measured?.deltaFHz ?? NaN) - visit.truth.deltaFHz) < 0.05,
        }).toEqual({ where, deltaFError: true });
      }
      const slope = trajectory.slopesHzPerYear.paf;
      expect(slope).not.toBeNull();
      const trend = participant.truth.iafTrendHzPerYear;
      if (trend < 0) {
        // Drifting slower: a clearly negative Theil–Sen slope, near the generated one.
        expect({ code: participant.code, slope: (slope ?? 0) < 0 }).toEqual({
          code: participant.code,
          slope: true,
        });
        expect(Math.abs((slope ?? 0) - trend)).toBeLessThan(0.15);
      } else {
        // Stable: only the ±0.03 Hz visit wobble, so the slope stays near zero.
        expect({ code: participant.code, flat: Math.abs(slope ?? 1) < 0.1 }).toEqual({
          code: participant.code,
          flat: true,
        });
      }
    }
  });

  it('registers every visit on its planned visit, with the late Month 4 visit marked', async () => {
    const technician = await tokenOf('technician', 'cedar');
    const c101 = seeded.participants.find((p) => p.code === 'LAF-C101');
    const response = await request(t.url)
      .get(`/api/visits?participantId=${c101?.participantId ?? ''}`)
      .set('Authorization', `Bearer ${technician}`);
    expect(response.status).toBe(200);
    const visits = (response.body as { items: VisitView[] }).items;
    // LAF-C101: enrolled 2024-01-15; Month 4 is day 121 ± 21 and was done on day 151.
    expect(visits.map((v) => [v.label, v.schedule.studyDay, v.schedule.window])).toEqual([
      ['Baseline', 0, 'in'],
      ['Month 4', 151, 'late'],
      ['Month 12', expect.any(Number), 'in'],
    ]);
  });

  it('shows the rejected upload with its reason to the technician of its site', async () => {
    const scenario = buildDemoScenario('small');
    const participant = scenario.participants.find(
      (p) => p.code === scenario.malformedUpload.participantCode,
    );
    const technician = await tokenOf('technician', participant?.siteKey ?? null);
    const response = await request(t.url)
      .get(`/api/recordings/${seeded.rejectedRecordingId}`)
      .set('Authorization', `Bearer ${technician}`);
    expect(response.status).toBe(200);
    const recording = response.body as RecordingView;
    expect(recording.state).toBe('rejected');
    expect(recording.kind).toBe('task');
    expect(recording.rejection?.message ?? '').not.toBe('');
    // The copy was cut inside its last data record, so the file is shorter than the header's
    // record count × record size (Kemp et al. 1992) and the reader names that record.
    expect(recording.rejection?.field).toBe('data records');
    expect(recording.rejection?.found ?? '').toMatch(/into record (\d+) of \1$/);
  });

  it("carries the analyst's flag with its reason on the scenario's visit", async () => {
    const monitor = await tokenOf('monitor');
    const response = await request(t.url)
      .get(`/api/visits/${seeded.flaggedVisitId}/flag`)
      .set('Authorization', `Bearer ${monitor}`);
    expect(response.status).toBe(200);
    const flag = response.body as VisitFlagView;
    expect(flag.current?.state).toBe('raised');
    expect(flag.current?.raiseReason).toBe(buildDemoScenario('small').flag.reason);
  });

  it('leaves reviewed and unreviewed visits on the worklist, one of them changed since its review', async () => {
    const scenario = buildDemoScenario('small');
    const analyst = await tokenOf('analyst');
    expect(seeded.reviewedVisitIds).toHaveLength(scenario.reviewedVisits.length);
    const replaced = seeded.replacedAfterReviewVisitId;
    expect(replaced).not.toBeNull();
    for (const visitId of seeded.reviewedVisitIds) {
      const response = await request(t.url)
        .get(`/api/visits/${visitId}/review`)
        .set('Authorization', `Bearer ${analyst}`);
      expect(response.status).toBe(200);
      const state = response.body as VisitReviewStateView;
      expect(state.latest?.reviewedByName).toBe('Demo analyst');
      // The replaced visit's review named the first take's run; the others still hold.
      expect({ visitId, reviewed: state.reviewed, changed: state.changedSinceReview }).toEqual(
        visitId === replaced
          ? { visitId, reviewed: false, changed: true }
          : { visitId, reviewed: true, changed: false },
      );
    }
    const response = await request(t.url)
      .get('/api/worklist?limit=50')
      .set('Authorization', `Bearer ${analyst}`);
    expect(response.status).toBe(200);
    const unreviewed = (response.body as WorklistView).sections.find((s) => s.key === 'unreviewed');
    const allVisits = seeded.participants.flatMap((p) => p.visits.map((v) => v.visitId));
    const expected = allVisits.filter(
      (id) => id === replaced || !seeded.reviewedVisitIds.includes(id),
    );
    // 9 visits, 5 reviewed, one of those changed since: 5 wait.
    expect(unreviewed?.total).toBe(9 - 5 + 1);
    expect(new Set(unreviewed?.items.map((i) => i.visitId))).toEqual(new Set(expected));
    const changed = unreviewed?.items.find((i) => i.visitId === replaced);
    expect(changed?.what).toMatch(
      /^Results changed since Demo analyst reviewed them on \d{4}-\d{2}-\d{2}$/,
    );
    // The worklist carries each visit's window: LAF-C101's Month 4 is the late one.
    const late = unreviewed?.items.find(
      (i) => i.participantCode === 'LAF-C101' && i.visitLabel === 'Month 4',
    );
    expect(late?.schedule).toMatchObject({ window: 'late', studyDay: 151, targetDay: 121 });
  });

  it("gives each site's coordinator the signed report of their site, and an e-mail about it", async () => {
    expect(seeded.signedVisitIds).toHaveLength(2);
    for (const siteKey of ['cedar', 'amber']) {
      const coordinator = await tokenOf('coordinator', siteKey);
      const response = await request(t.url)
        .get('/api/reports')
        .set('Authorization', `Bearer ${coordinator}`);
      expect(response.status).toBe(200);
      const reports = (response.body as { items: ReportView[] }).items;
      expect(reports).toHaveLength(1);
      expect(['signed', 'sent']).toContain(reports[0].state);
      expect(seeded.signedVisitIds).toContain(reports[0].visitId);
      const account = seeded.credentials.find(
        (c) => c.role === 'coordinator' && c.siteKey === siteKey,
      );
      await waitForMail(t.config.mailDir, { to: account?.email ?? '', subject: /sign|report/i });
    }
  });

  it('uploaded every recording through a technician of its own site', async () => {
    const analyst = await tokenOf('analyst');
    const me = async (role: string, siteKey: string): Promise<string> => {
      const response = await request(t.url)
        .get('/api/auth/me')
        .set('Authorization', `Bearer ${await tokenOf(role, siteKey)}`);
      return (response.body as { user: { id: string } }).user.id;
    };
    const technicianIds = new Map<string, string>();
    for (const key of ['cedar', 'amber']) technicianIds.set(key, await me('technician', key));
    const response = await request(t.url)
      .get('/api/recordings?pageSize=200')
      .set('Authorization', `Bearer ${analyst}`);
    const recordings = (response.body as { items: RecordingView[] }).items;
    expect(recordings).toHaveLength(20);
    for (const participant of seeded.participants) {
      const expected = technicianIds.get(participant.truth.siteKey);
      for (const recording of recordings.filter(
        (r) => r.participantId === participant.participantId,
      )) {
        expect(recording.uploadedById).toBe(expected);
      }
    }
  });

  it('writes every demo account to demo-accounts.txt (mode 600), and each one signs in', async () => {
    const file = seeded.accountsFile ?? '';
    // Owner read/write only (POSIX permission bits).
    expect(statSync(file).mode & 0o777).toBe(0o600);
    const text = readFileSync(file, 'utf8');
    expect(seeded.credentials).toHaveLength(7);
    for (const account of seeded.credentials) {
      expect(text).toContain(account.email);
      expect(text).toContain(account.password);
      const response = await request(t.url)
        .post('/api/auth/sign-in')
        .send({ email: account.email, password: account.password });
      expect({ email: account.email, status: response.status }).toEqual({
        email: account.email,
        status: 200,
      });
      expect((response.body as { user: { role: string } }).user.role).toBe(account.role);
    }
  });

  it('refuses to seed an installation that already has accounts, and changes nothing', async () => {
    const again = await seedSmallDemo();
    expect(again.status).toBe('not-empty');
    const analyst = await tokenOf('analyst');
    const response = await request(t.url)
      .get('/api/recordings?pageSize=200')
      .set('Authorization', `Bearer ${analyst}`);
    expect((response.body as { total: number }).total).toBe(20);
  });
});
