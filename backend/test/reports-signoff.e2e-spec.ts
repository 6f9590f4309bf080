/**
 * Visit report sign-off through the real API: a temporary DATA_DIR with a real SQLite file,
 * real worker threads computing generated recordings (recordings-fixtures.ts), PDFs read
 * back with pdf-parse, and the e-mail delivered over SMTP to Gyre's own fake SMTP server,
 * which this test stops and starts again on the same port for the outage case.
 */
import { createHash } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { hash } from 'bcryptjs';
import request from 'supertest';
import { IsNull } from 'typeorm';
import type {
  AuditEntryView,
  OutboxMessageView,
  Page,
  RecordingView,
  RecordingResultsView,
  ReportRevisionView,
  ReportSignOffView,
} from '@gyre/shared';
import { SIGNATURE_MEANING } from '@gyre/shared';
import { sqliteHandleOf } from '../src/common/database/sqlite-handle';
import { FakeSmtpServer } from '../src/mail/fake-smtp-server';
import { OutboxMessage } from '../src/mail/outbox-message.entity';
import { MAX_BACKOFF_MS, MAX_SEND_ATTEMPTS, OutboxService } from '../src/mail/outbox.service';
import { RESEARCH_CAUTION } from '../src/report-document/report-wording';
import { readPdfText } from '../src/report-document/testing/read-pdf-text';
import { ReportRevision } from '../src/signoff/report-revision.entity';
import { User } from '../src/accounts/user.entity';
import { newUserRow } from '../src/users/new-user-row';
import { SEED_PASSWORD, UserKey } from './helpers/seed';
import { CaughtMail, readMails, waitForMail } from './helpers/mail-catcher';
import { binaryBody } from './helpers/binary-body';
import { startTestApp, TEST_PUBLIC_URL, TestApp } from './helpers/test-app';
import { syntheticRestEdf, syntheticTaskEdf, upload, waitForState } from './recordings-fixtures';

const sha256 = (bytes: Uint8Array): string => createHash('sha256').update(bytes).digest('hex');
const squash = (text: string): string => text.replace(/\s+/g, ' ').trim();
/** The report prints signed changes with the typographic minus, to 0.01 Hz as on screen. */
const signedHz = (value: number): string =>
  `${value < 0 ? '\u2212' : '+'}${Math.abs(value).toFixed(2)}`;

describe('visit report sign-off', () => {
  let t: TestApp;
  let smtp: FakeSmtpServer;
  let smtpPort: number;
  let mailDir: string;
  let visitId: string;
  let reportId: string;
  let restResults: RecordingResultsView;
  let taskResults: RecordingResultsView;
  let revision1: ReportRevisionView;
  let revision1Pdf: Buffer;
  let revision2: ReportRevisionView;
  const secondCoordinator = { email: 'second.coordinator@gyre.test', name: 'Second Coordinator' };
  const invitedCoordinator = { email: 'invited.coordinator@gyre.test' };

  const as = (user: UserKey) => t.authHeader(user);
  const signOff = async (user: UserKey = 'analyst'): Promise<ReportSignOffView> => {
    const response = await request(t.url)
      .get(`/api/visits/${visitId}/report/sign-off`)
      .set(await as(user));
    expect(response.status).toBe(200);
    return response.body as ReportSignOffView;
  };
  const pdf = async (path: string, user: UserKey): Promise<request.Response> =>
    request(t.url)
      .get(path)
      .set(await as(user))
      .buffer(true)
      .parse(binaryBody);
  /** Signs the visit's report as `user`, with the seeded password and Gyre's meaning unless given. */
  const sign = async (
    body: { fingerprint: string | null; password?: string; meaning?: string },
    user: UserKey = 'analyst',
  ) =>
    request(t.url)
      .post(`/api/visits/${visitId}/report/sign`)
      .set(await as(user))
      .send({ password: SEED_PASSWORD, meaning: SIGNATURE_MEANING, ...body });
  const mailsTo = async (address: string): Promise<CaughtMail[]> =>
    (await readMails(mailDir)).filter((m) => m.to.toLowerCase().includes(address.toLowerCase()));

  beforeAll(async () => {
    mailDir = mkdtempSync(join(tmpdir(), 'gyre-signoff-mail-'));
    smtp = new FakeSmtpServer(mailDir);
    smtpPort = await smtp.start();
    t = await startTestApp({ env: { SMTP_URL: `smtp://127.0.0.1:${smtpPort}` } });
    visitId = t.seed.visits.A1.id;
    // A second active coordinator of site A1 and one still invited (generated test data).
    const at = new Date().toISOString();
    const coordinatorOfA1 = {
      role: 'coordinator' as const,
      studyId: t.seed.studies.A.id,
      siteId: t.seed.sites.A1.id,
    };
    await t.dataSource
      .getRepository(User)
      .insert([
        newUserRow({ ...coordinatorOfA1, ...secondCoordinator }, await hash(SEED_PASSWORD, 10), at),
        newUserRow(
          { ...coordinatorOfA1, email: invitedCoordinator.email, name: 'Invited Coordinator' },
          null,
          at,
        ),
      ]);

    const rest = await upload(t, 'technician', visitId, {
      kind: 'resting',
      bytes: syntheticRestEdf({ durationS: 40, peakHz: 9.5 }),
      fileName: 'rest.edf',
    });
    const task = await upload(t, 'technician', visitId, {
      kind: 'task',
      bytes: syntheticTaskEdf({ durationS: 40, seed: 5 }),
      fileName: 'task.edf',
    });
    expect([rest.status, task.status]).toEqual([201, 201]);
    for (const response of [rest, task]) {
      const done = await waitForState(t, 'technician', (response.body as RecordingView).id, [
        'ready',
        'failed',
      ]);
      expect(done.state).toBe('ready');
    }
    const results = async (recordingId: string) =>
      (
        await request(t.url)
          .get(`/api/recordings/${recordingId}/results`)
          .set(await as('analyst'))
      ).body as RecordingResultsView;
    restResults = await results((rest.body as RecordingView).id);
    taskResults = await results((task.body as RecordingView).id);
  });

  afterAll(async () => {
    await t.close();
    await smtp.stop();
    rmSync(mailDir, { recursive: true, force: true });
  });

  it('starts as a draft that an analyst may sign as revision 1', async () => {
    const status = await signOff();
    reportId = status.report.id;
    expect(status.report.state).toBe('draft');
    expect(status).toMatchObject({
      canSign: true,
      pendingRevision: 1,
      meaning: SIGNATURE_MEANING,
      revisions: [],
    });
    expect(status.draftFingerprint).toMatch(/^[0-9a-f]{64}$/);
    // Generated recordings: alpha near 9.5 Hz at rest, a dip after each onset (fixtures).
    expect(restResults.rest?.pafHz).toBeGreaterThan(9);
    expect(taskResults.run.roiDeltaFHz).toBeLessThan(0);
  });

  it('previews the draft PDF with the numbers the results API gives, the caution on every page, marked DRAFT', async () => {
    const response = await pdf(`/api/visits/${visitId}/report/preview`, 'analyst');
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toBe('application/pdf');
    expect(response.headers['content-disposition']).toMatch(
      /^inline; filename="gyre-report-A1-0001-V1-draft\.pdf"$/,
    );
    const { pages } = await readPdfText(response.body as Buffer);
    const text = squash(pages.join(' '));
    const rest = restResults.rest!;
    const run = taskResults.run;
    // The rounding the report states: PAF/CoG, Δf and CI to 0.01 Hz, p to 0.001.
    expect(text).toContain(`Peak alpha frequency (PAF) ${rest.pafHz!.toFixed(2)} Hz`);
    expect(text).toContain(`Centre of gravity (CoG) ${rest.cogHz!.toFixed(2)} Hz`);
    expect(text).toContain(`Δf (post − baseline) ${signedHz(run.roiDeltaFHz!)} Hz`);
    expect(text).toContain(
      `95 % CI of mean Δf ${signedHz(run.roiCiHz![0])} to ${signedHz(run.roiCiHz![1])} Hz`,
    );
    const p = run.roiPValue!;
    expect(text).toContain(`Wilcoxon signed-rank p ${p < 0.001 ? '< 0.001' : p.toFixed(3)}`);
    expect(text).toContain(`Input SHA-256 ${run.inputChecksumSha256}`);
    expect(text).toContain(`Input SHA-256 ${restResults.run.inputChecksumSha256}`);
    expect(text).toContain(`Code version ${run.codeVersion}`);
    expect(text).toContain('Participant A1-0001');
    for (const page of pages.map(squash)) {
      expect(page).toContain(RESEARCH_CAUTION);
      expect(page).toContain('DRAFT · NOT SIGNED');
    }
    expect(text).toContain('Not signed.');
  });

  it('keeps the preview and the sign-off state from coordinators and technicians', async () => {
    for (const user of ['coordinator', 'technician'] as const) {
      expect((await pdf(`/api/visits/${visitId}/report/preview`, user)).status).toBe(403);
      const status = await request(t.url)
        .get(`/api/visits/${visitId}/report/sign-off`)
        .set(await as(user));
      expect(status.status).toBe(403);
    }
  });

  it('refuses a signature with another meaning, naming the field', async () => {
    const { draftFingerprint } = await signOff();
    const response = await sign({ meaning: 'looked at it', fingerprint: draftFingerprint });
    expect(response.status).toBe(400);
    expect(response.body.code).toBe('SIGNOFF_WRONG_MEANING');
    expect(response.body.message).toContain('meaning: found "looked at it", expected');
  });

  it('refuses a wrong password with 422 (the session stays valid) and signs nothing', async () => {
    const { draftFingerprint } = await signOff();
    const response = await sign({ password: 'not-the-password-42', fingerprint: draftFingerprint });
    expect(response.status).toBe(422);
    expect(response.body.code).toBe('SIGNOFF_WRONG_PASSWORD');
    const status = await signOff();
    expect(status.report.state).toBe('draft');
    expect(status.revisions).toEqual([]);
    expect(await readMails(mailDir)).toEqual([]);
  });

  it('refuses a fingerprint other than the current draft (the visit changed since preview)', async () => {
    const response = await sign({ fingerprint: 'a'.repeat(64) });
    expect(response.status).toBe(409);
    expect(response.body.code).toBe('SIGNOFF_CONTENT_CHANGED');
  });

  it('lets no admin, coordinator or analyst of another study sign', async () => {
    const { draftFingerprint } = await signOff();
    const body = { fingerprint: draftFingerprint };
    // Separation of duties (docs/user-guide.md): admins never sign.
    expect((await sign(body, 'admin')).status).toBe(403);
    expect((await sign(body, 'coordinator')).status).toBe(403);
    // Another study's analyst does not even see the report.
    expect((await sign(body, 'analystB')).status).toBe(404);
  });

  it('signs revision 1: the signed PDF carries name, UTC date and time, meaning, numbers and caution', async () => {
    const { draftFingerprint } = await signOff();
    const response = await sign({ fingerprint: draftFingerprint });
    expect(response.status).toBe(201);
    revision1 = response.body as ReportRevisionView;
    expect(revision1).toMatchObject({
      reportId,
      revision: 1,
      state: 'signed',
      signerName: 'Seeded analyst',
      meaning: SIGNATURE_MEANING,
      supersedesId: null,
      participantCode: 'A1-0001',
      visitLabel: 'V1',
    });
    const file = await pdf(`/api/report-revisions/${revision1.id}/file`, 'analyst');
    expect(file.status).toBe(200);
    revision1Pdf = file.body as Buffer;
    expect(sha256(revision1Pdf)).toBe(revision1.pdfSha256);
    expect(file.headers['x-content-sha256']).toBe(revision1.pdfSha256);
    expect(revision1Pdf.length).toBe(revision1.pdfSizeBytes);
    const { pages } = await readPdfText(revision1Pdf);
    const text = squash(pages.join(' '));
    const signedAt = revision1.signedAt.replace('T', ' ').slice(0, 19);
    expect(text).toContain('Signed by Seeded analyst');
    expect(text).toContain(`Date and time ${signedAt} UTC`);
    expect(text).toContain(`Meaning ${SIGNATURE_MEANING}`);
    expect(text).toContain(`Peak alpha frequency (PAF) ${restResults.rest!.pafHz!.toFixed(2)} Hz`);
    expect(text).toContain(`Δf (post − baseline) ${signedHz(taskResults.run.roiDeltaFHz!)} Hz`);
    expect(text).not.toContain('DRAFT');
    pages.forEach((page, index) => {
      expect(squash(page)).toContain(RESEARCH_CAUTION);
      expect(squash(page)).toContain(`Page ${index + 1} of ${pages.length}`);
    });
  });

  it('e-mails every active coordinator of the site a link to the report and nothing else', async () => {
    const first = await waitForMail(mailDir, { to: 'coordinator@gyre.test' });
    const second = await waitForMail(mailDir, { to: secondCoordinator.email });
    await t.mailIdle();
    for (const mail of [first, second]) {
      expect(mail.text).toContain(`${TEST_PUBLIC_URL}/reports/revisions?revision=${revision1.id}`);
      // Which report: the participant's pseudonymous code, the visit, the study and the site,
      // with the signing time in words and its zone; no number of the report, no raw ISO stamp.
      expect(squash(mail.text)).toContain(
        // The seed's visit V1 of 2026-01-15 in study ALPHA.
        'The visit report of participant A1-0001, visit V1 of 15 January 2026',
      );
      expect(squash(mail.text)).toContain('(study ALPHA, Site A1), was signed in Gyre on ');
      expect(mail.text).toMatch(/signed in Gyre on \d{1,2} [A-Z][a-z]+ \d{4}, \d{2}:\d{2} UTC\./);
      expect(mail.text).not.toMatch(/\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/);
      expect(mail.text).not.toContain(restResults.rest!.pafHz!.toFixed(2));
      // No attachment: a single text part (RFC 2045: no multipart body).
      expect(mail.raw).not.toMatch(/^content-type:\s*multipart/im);
      expect(mail.raw).not.toMatch(/application\/pdf/i);
      expect(mail.subject).toBe('Gyre: report signed for A1-0001, visit V1 (Site A1)');
    }
    // Exactly the two active coordinators of A1: one message each, one recipient each.
    expect(await readMails(mailDir)).toHaveLength(2);
    expect(first.to).not.toContain(',');
    expect(await mailsTo(invitedCoordinator.email)).toEqual([]);
    expect(await mailsTo('coordinatora2@gyre.test')).toEqual([]);
    expect(await mailsTo('coordinatorb@gyre.test')).toEqual([]);
  });

  it('marks the revision and the report sent as soon as the last message is delivered', async () => {
    // Straight after delivery, before any read of the sign-off routes (the outbox's listener).
    const row = await t.dataSource
      .getRepository(ReportRevision)
      .findOneByOrFail({ id: revision1.id });
    expect(row.state).toBe('sent');
    expect(row.sentAt).not.toBeNull();
    const report = await request(t.url)
      .get(`/api/visits/${visitId}/report`)
      .set(await as('coordinator'));
    expect(report.status).toBe(200);
    expect(report.body.state).toBe('sent');
  });

  it('shows admins the messages as sent in the outbox, and the revision becomes sent', async () => {
    const outbox = await request(t.url)
      .get('/api/mail/outbox')
      .set(await as('admin'));
    const mine = (outbox.body as Page<OutboxMessageView>).items.filter(
      (m) => m.kind === 'report_signed',
    );
    expect(mine.map((m) => [m.to, m.state, m.attempts]).sort()).toEqual([
      ['coordinator@gyre.test', 'sent', 1],
      [secondCoordinator.email, 'sent', 1],
    ]);
    const list = await request(t.url)
      .get('/api/report-revisions')
      .query({ visitId })
      .set(await as('analyst'));
    expect((list.body as Page<ReportRevisionView>).items[0]).toMatchObject({
      id: revision1.id,
      state: 'sent',
    });
    expect((await signOff()).report.state).toBe('sent');
  });

  it('lets the coordinator of the site list and download the signed report, byte for byte', async () => {
    const list = await request(t.url)
      .get('/api/report-revisions')
      .set(await as('coordinator'));
    expect(list.status).toBe(200);
    expect((list.body as Page<ReportRevisionView>).items.map((r) => r.id)).toEqual([revision1.id]);
    const byReport = await pdf(`/api/reports/${reportId}/file`, 'coordinator');
    expect(byReport.status).toBe(200);
    expect(byReport.headers['content-disposition']).toBe(
      'attachment; filename="gyre-report-A1-0001-V1-r1.pdf"',
    );
    expect(sha256(byReport.body as Buffer)).toBe(revision1.pdfSha256);
  });

  it('shows the coordinator nothing else of the visit, and other sites nothing at all', async () => {
    const recordings = await request(t.url)
      .get('/api/recordings')
      .query({ visitId })
      .set(await as('coordinator'));
    expect(recordings.status).toBe(403);
    const flag = await request(t.url)
      .get(`/api/visits/${visitId}/flag`)
      .set(await as('coordinator'));
    expect(flag.status).toBe(403);
    const results = await request(t.url)
      .get(`/api/recordings/${taskResults.run.recordingId}/results`)
      .set(await as('coordinator'));
    expect(results.status).toBe(403);
    // Another site's coordinator: the revision does not exist for them.
    const other = await request(t.url)
      .get('/api/report-revisions')
      .set(await as('coordinatorA2'));
    expect((other.body as Page<ReportRevisionView>).total).toBe(0);
    expect((await pdf(`/api/report-revisions/${revision1.id}/file`, 'coordinatorA2')).status).toBe(
      404,
    );
    expect((await pdf(`/api/reports/${reportId}/file`, 'coordinatorB')).status).toBe(404);
  });

  it('answers each role as the role table says: 403 never allowed, 404 outside their study or site', async () => {
    const expected: Array<[UserKey, number, number, number]> = [
      // [user, sign-off state, preview, signed file]
      ['analyst', 200, 200, 200],
      ['monitor', 200, 200, 200],
      ['coordinator', 403, 403, 200],
      ['technician', 403, 403, 403],
      ['admin', 403, 403, 403],
      ['coordinatorA2', 403, 403, 404],
      ['coordinatorB', 403, 403, 404],
      ['analystB', 404, 404, 404],
      ['monitorB', 404, 404, 404],
    ];
    for (const [user, stateStatus, previewStatus, fileStatus] of expected) {
      const header = await as(user);
      const state = await request(t.url).get(`/api/visits/${visitId}/report/sign-off`).set(header);
      const preview = await pdf(`/api/visits/${visitId}/report/preview`, user);
      const file = await pdf(`/api/report-revisions/${revision1.id}/file`, user);
      expect([user, state.status, preview.status, file.status]).toEqual([
        user,
        stateStatus,
        previewStatus,
        fileStatus,
      ]);
    }
  });

  it('cannot alter a signed report through any route', async () => {
    const { draftFingerprint, canSign } = await signOff();
    expect(canSign).toBe(false);
    // Signing again without a change is refused.
    const again = await sign({ fingerprint: draftFingerprint ?? 'a'.repeat(64) });
    expect(again.status).toBe(409);
    expect(again.body.code).toBe('SIGNOFF_ALREADY_SIGNED');
    // No write route exists on revisions, their files or report files.
    const header = await as('analyst');
    for (const path of [
      `/api/report-revisions/${revision1.id}`,
      `/api/report-revisions/${revision1.id}/file`,
      `/api/reports/${reportId}/file`,
    ]) {
      for (const method of ['put', 'patch', 'delete', 'post'] as const) {
        const response = await request(t.url)[method](path).set(header).send({ signerName: 'X' });
        expect(response.status).toBe(404);
      }
    }
    // Not even the database takes a change: triggers refuse UPDATE and DELETE (raw SQLite,
    // so that no ORM layer stands between the statement and the table).
    const db = sqliteHandleOf(t.dataSource);
    expect(() =>
      db
        .prepare(`UPDATE "report_revision" SET "pdfSha256" = ? WHERE "id" = ?`)
        .run('b'.repeat(64), revision1.id),
    ).toThrow(/never changes: UPDATE refused/);
    expect(() =>
      db
        .prepare(`UPDATE "report_revision" SET "state" = 'signed', "sentAt" = NULL WHERE "id" = ?`)
        .run(revision1.id),
    ).toThrow(/UPDATE refused/);
    expect(() =>
      db
        .prepare(`UPDATE "report_revision" SET "signerName" = 'Someone Else' WHERE "id" = ?`)
        .run(revision1.id),
    ).toThrow(/UPDATE refused/);
    expect(() =>
      db.prepare(`DELETE FROM "report_revision" WHERE "id" = ?`).run(revision1.id),
    ).toThrow(/DELETE refused/);
    const file = await pdf(`/api/report-revisions/${revision1.id}/file`, 'analyst');
    expect(sha256(file.body as Buffer)).toBe(revision1.pdfSha256);
  });

  it('makes a new revision after a flag is raised; revision 1 stays downloadable unchanged', async () => {
    const reason = 'Slowing over O1 and O2 with a CI clear of zero (test)';
    const raised = await request(t.url)
      .post(`/api/visits/${visitId}/flag/raise`)
      .set(await as('analyst'))
      .send({ reason });
    expect(raised.status).toBe(201);
    const status = await signOff();
    // The report stays what it was (sent); the change waits as revision 2.
    expect(status.report.state).toBe('sent');
    expect(status).toMatchObject({ canSign: true, pendingRevision: 2 });
    expect(status.draftFingerprint).not.toBe(null);
    const response = await sign({ fingerprint: status.draftFingerprint });
    expect(response.status).toBe(201);
    revision2 = response.body as ReportRevisionView;
    expect(revision2).toMatchObject({ revision: 2, supersedesId: revision1.id });
    expect(revision2.pdfSha256).not.toBe(revision1.pdfSha256);
    const second = await pdf(`/api/report-revisions/${revision2.id}/file`, 'coordinator');
    const text = squash((await readPdfText(second.body as Buffer)).text);
    expect(text).toContain(reason);
    expect(text).toContain('Replaces signed revision 1');
    expect(text).toContain(`Its SHA-256 ${revision1.pdfSha256}`);
    const first = await pdf(`/api/report-revisions/${revision1.id}/file`, 'coordinator');
    expect(Buffer.compare(first.body as Buffer, revision1Pdf)).toBe(0);
    const list = await request(t.url)
      .get('/api/report-revisions')
      .set(await as('coordinator'));
    expect((list.body as Page<ReportRevisionView>).items.map((r) => r.revision)).toEqual([2, 1]);
    // The report file route serves the newest signed revision.
    const latest = await pdf(`/api/reports/${reportId}/file`, 'coordinator');
    expect(sha256(latest.body as Buffer)).toBe(revision2.pdfSha256);
    await waitForMail(mailDir, { to: secondCoordinator.email, subject: /signed/ });
    await t.mailIdle();
    expect(await mailsTo(secondCoordinator.email)).toHaveLength(2);
  });

  it('keeps the message queued while the SMTP server is down and delivers it exactly once after it is back', async () => {
    const cleared = await request(t.url)
      .post(`/api/visits/${visitId}/flag/clear`)
      .set(await as('analyst'))
      .send({ reason: 'Re-read: the dip is within the noise of this visit (test)' });
    expect(cleared.status).toBe(201);
    await smtp.stop();
    const before = (await readMails(mailDir)).length;
    const status = await signOff();
    const response = await sign({ fingerprint: status.draftFingerprint });
    expect(response.status).toBe(201);
    const revision3 = response.body as ReportRevisionView;
    await t.mailIdle();
    const outbox = t.dataSource.getRepository(OutboxMessage);
    const waiting = await outbox.find({ where: { kind: 'report_signed', state: 'queued' } });
    expect(waiting).toHaveLength(2);
    for (const message of waiting) {
      expect(message.attempts).toBe(1);
      expect(message.lastError).toMatch(/ECONNREFUSED|connect/i);
      expect(message.textBody).toContain(revision3.id);
    }
    expect(await readMails(mailDir)).toHaveLength(before);
    expect((await signOff()).revisions[0]).toMatchObject({ id: revision3.id, state: 'signed' });

    // A long outage: past MAX_SEND_ATTEMPTS the message still waits (an unreachable server
    // is transient), with the backoff capped at MAX_BACKOFF_MS.
    const sender = t.app.get(OutboxService);
    await outbox.update(
      { kind: 'report_signed', state: 'queued' },
      { attempts: MAX_SEND_ATTEMPTS + 3, nextAttemptAt: new Date().toISOString() },
    );
    sender.kick();
    await t.mailIdle();
    for (const message of await outbox.find({
      where: { kind: 'report_signed', sentAt: IsNull() },
    })) {
      expect(message).toMatchObject({ state: 'queued', attempts: MAX_SEND_ATTEMPTS + 4 });
      expect(message.textBody).toContain(revision3.id);
      const waitMs = Date.parse(message.nextAttemptAt ?? '') - Date.now();
      expect(waitMs).toBeGreaterThan(MAX_BACKOFF_MS - 60_000);
      expect(waitMs).toBeLessThanOrEqual(MAX_BACKOFF_MS);
    }

    // The server comes back on its old port; the backoff delay (30 s) is skipped by making
    // the messages due now instead of waiting for it.
    smtp = new FakeSmtpServer(mailDir);
    expect(await smtp.start(smtpPort)).toBe(smtpPort);
    await outbox.update(
      { kind: 'report_signed', state: 'queued' },
      { nextAttemptAt: new Date().toISOString() },
    );
    sender.kick();
    sender.kick();
    await t.mailIdle();
    sender.kick();
    await t.mailIdle();
    const delivered = (await readMails(mailDir)).slice(before);
    expect(delivered.map((m) => m.to).sort()).toEqual([
      'coordinator@gyre.test',
      secondCoordinator.email,
    ]);
    for (const mail of delivered) expect(mail.text).toContain(`revision=${revision3.id}`);
    const after = await outbox.find({ where: { kind: 'report_signed' } });
    expect(after.filter((m) => m.state !== 'sent')).toEqual([]);
    expect(after.filter((m) => m.attempts === MAX_SEND_ATTEMPTS + 5)).toHaveLength(2);
    // Each delivered message carries its outbox id as Message-ID (the same on every attempt).
    const ids = after.filter((m) => m.attempts === MAX_SEND_ATTEMPTS + 5).map((m) => m.id);
    for (const mail of delivered) {
      const header = /^message-id:\s*<([^@>]+)@gyre\.invalid>/im.exec(mail.raw);
      expect(ids).toContain(header?.[1]);
    }
    expect((await signOff()).revisions[0]).toMatchObject({ id: revision3.id, state: 'sent' });
  });

  it('writes every step to the audit trail', async () => {
    const response = await request(t.url)
      .get('/api/audit')
      .query({ objectType: 'Report', objectId: reportId, pageSize: 200, order: 'asc' })
      .set(await as('monitor'));
    expect(response.status).toBe(200);
    const entries = (response.body as Page<AuditEntryView>).items;
    const actions = entries.map((e) => e.action);
    for (const action of [
      'create',
      'preview',
      'sign-refused',
      'sign',
      'notify',
      'sent',
      'download',
    ]) {
      expect(actions).toContain(action);
    }
    expect(actions.filter((a) => a === 'sign')).toHaveLength(3);
    expect(actions.filter((a) => a === 'notify')).toHaveLength(6);
    const firstSign = entries.find((e) => e.action === 'sign');
    expect(JSON.stringify(firstSign?.after)).toContain(revision1.pdfSha256);
    expect(firstSign?.actorEmail).toBe('analyst@gyre.test');
  });
});
