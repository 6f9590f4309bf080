/**
 * Backup and restore of a whole data folder, on a real server that is uploading and computing
 * while the backup runs. Sources: SQLite's online backup API
 * (https://www.sqlite.org/backup.html, https://www.sqlite.org/c3ref/backup_finish.html: a copy
 * of one committed state while other connections write); OWASP ASVS 4.0 V8.1.5 (backups are
 * taken and a restore is tested), V8.1.6 (backups stored securely: owner-only modes here) and
 * V12.3.1 (no path from user input leaves its folder). Checksums are recomputed here with
 * node:crypto (SHA-256, FIPS 180-4) independently of the backup code.
 */
import { createHash } from 'node:crypto';
import {
  appendFileSync,
  existsSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  readFileSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import type { AuditVerifyResult, RecordingView, RecordingResultsView } from '@gyre/shared';
import { createBackup } from '../src/backup/backup';
import type { BackupManifest } from '../src/backup/backup-manifest';
import { restoreBackup, verifyBackup } from '../src/backup/restore';
import { ComputationsService } from '../src/processing/computations.service';
import { SEED_PASSWORD } from './helpers/seed';
import { binaryBody } from './helpers/binary-body';
import { newVisit } from './helpers/new-visit';
import { startTestApp, TestApp } from './helpers/test-app';
import { syntheticRestEdf, syntheticTaskEdf, upload, waitForState } from './recordings-fixtures';

const sha256 = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex');

/** Every regular file under `root` with its mode, relative path → bytes (recomputed here). */
function tree(root: string, under = ''): Map<string, { sha256: string; mode: number }> {
  const found = new Map<string, { sha256: string; mode: number }>();
  for (const name of readdirSync(join(root, under)).sort()) {
    const path = under === '' ? name : `${under}/${name}`;
    const stats = statSync(join(root, path));
    if (stats.isDirectory()) {
      expect({ path, mode: stats.mode & 0o777 }).toEqual({ path, mode: 0o700 });
      for (const [p, v] of tree(root, path)) found.set(p, v);
    } else {
      found.set(path, { sha256: sha256(readFileSync(join(root, path))), mode: stats.mode & 0o777 });
    }
  }
  return found;
}

async function download(url: string, path: string, auth: { Authorization: string }) {
  const response = await request(url).get(path).set(auth).buffer(true).parse(binaryBody);
  expect(response.status).toBe(200);
  return response.body as Buffer;
}

async function signIn(url: string, email: string): Promise<{ Authorization: string }> {
  const response = await request(url)
    .post('/api/auth/sign-in')
    .send({ email, password: SEED_PASSWORD });
  expect(response.status).toBe(200);
  return { Authorization: `Bearer ${(response.body as { accessToken: string }).accessToken}` };
}

async function recordingsOf(url: string, auth: { Authorization: string }) {
  const response = await request(url).get('/api/recordings').query({ pageSize: 100 }).set(auth);
  expect(response.status).toBe(200);
  return new Map((response.body.items as RecordingView[]).map((r) => [r.id, r]));
}

async function verifyOf(url: string, auth: { Authorization: string }) {
  const response = await request(url).get('/api/audit/verify').set(auth);
  expect(response.status).toBe(200);
  return response.body as AuditVerifyResult;
}

/** Waits for the computations; on a timeout, says what the queue holds. */
async function idle(app: TestApp, label: string): Promise<void> {
  try {
    // Generous: the machine may be busy with other work (common practice for timing).
    await app.app.get(ComputationsService).idle(120_000);
  } catch (error) {
    const jobs = (await app.dataSource.query(
      `SELECT "subjectId", "state", "attempts", "runAfter", "error" FROM "job"`,
    )) as unknown[];
    const recordings = (await app.dataSource.query(
      `SELECT "id", "kind", "state", "visitId" FROM "recording"`,
    )) as unknown[];
    throw new Error(
      `${label}: ${String(error)}\njobs ${JSON.stringify(jobs)}\nrecordings ${JSON.stringify(recordings)}`,
      { cause: error },
    );
  }
}

describe('backup and restore', () => {
  let t: TestApp;
  const work = mkdtempSync(join(tmpdir(), 'gyre-backup-test-'));
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(async () => {
    await t.close();
    rmSync(work, { recursive: true, force: true });
  });

  const restFile = syntheticRestEdf({ durationS: 40, peakHz: 9.5, seed: 11 });
  const restFile2 = syntheticRestEdf({ durationS: 40, peakHz: 10.2, seed: 12 });
  const taskFile = (seed: number) => syntheticTaskEdf({ durationS: 40, seed });

  let backupDir: string;
  let manifest: BackupManifest;
  let restoredDir: string;
  let baseline: RecordingView[];

  it(
    'takes a consistent backup while uploads and computations run; Gyre starts on the restored ' +
      'folder with the same recordings, the same files and an intact audit chain',
    async () => {
      // Recordings computed before the backup: they must come back exactly as they were.
      const visit = await newVisit(t, 'V2');
      const rest = await upload(t, 'technician', visit, { kind: 'resting', bytes: restFile });
      const task = await upload(t, 'technician', visit, { kind: 'task', bytes: taskFile(21) });
      expect([rest.status, task.status]).toEqual([201, 201]);
      baseline = [
        await waitForState(t, 'technician', (rest.body as RecordingView).id, ['ready'], 240_000),
        await waitForState(t, 'technician', (task.body as RecordingView).id, ['ready'], 240_000),
      ];

      // More uploads, and the backup taken while they are received and computed. One kind per
      // visit, so no task waits for a rest: two waiting tasks can outrun ComputationsService's
      // single wake-up timer (a queue matter, not the backup's).
      const visits = [
        await newVisit(t, 'V3'),
        await newVisit(t, 'V4'),
        await newVisit(t, 'V5'),
        await newVisit(t, 'V6'),
      ];
      const uploads = [
        upload(t, 'technician', visits[0], { kind: 'task', bytes: taskFile(30) }),
        upload(t, 'technician', visits[1], { kind: 'task', bytes: taskFile(31) }),
        upload(t, 'technician', visits[2], { kind: 'resting', bytes: restFile }),
        upload(t, 'technician', visits[3], { kind: 'resting', bytes: restFile2 }),
      ];
      await Promise.race(uploads);
      backupDir = join(work, 'backup');
      ({ manifest } = await createBackup({ dataDir: t.config.dataDir, outDir: backupDir }));
      expect((await Promise.all(uploads)).map((r) => r.status)).toEqual(Array(4).fill(201));
      await idle(t, 'original');
      const [{ seq: finalHead }] = (await t.dataSource.query(
        `SELECT MAX("seq") AS "seq" FROM "audit_entry"`,
      )) as { seq: number }[];
      // The server went on writing after the snapshot: the backup was taken mid-flight.
      expect(manifest.database.auditHead?.seq).toBeLessThan(finalHead);

      // The manifest names every file of the backup with its SHA-256; owner-only modes.
      const inBackup = tree(backupDir);
      expect(statSync(backupDir).mode & 0o777).toBe(0o700);
      expect([...inBackup.keys()].sort()).toEqual(
        [...manifest.files.map((f) => f.path), 'manifest.json'].sort(),
      );
      for (const file of manifest.files) {
        expect(inBackup.get(file.path)).toEqual({ sha256: file.sha256, mode: 0o600 });
      }
      const paths = manifest.files.map((f) => f.path);
      expect(paths).toEqual(
        expect.arrayContaining([
          'gyre.sqlite',
          'audit-anchors.jsonl',
          'secrets/audit-anchor-ed25519.pem',
          ...baseline.map((r) => `uploads/${r.checksumSha256}.edf`),
        ]),
      );
      expect(paths.some((p) => p.startsWith('mail/') || p.startsWith('uploads/tmp/'))).toBe(false);
      // Stored files never change: each equals the original's bytes.
      for (const file of manifest.files.filter((f) => /^(uploads|secrets)\//.test(f.path))) {
        expect(sha256(readFileSync(join(t.config.dataDir, file.path)))).toBe(file.sha256);
      }

      // Read from the original before a second app starts: passport keeps one 'jwt' strategy
      // per process, so only the newest app in this process can check tokens.
      const analystOfT = await t.authHeader('analyst');
      const before = await recordingsOf(t.url, analystOfT);
      const baselineResults = await Promise.all(
        baseline.map(async (recording) => {
          const response = await request(t.url)
            .get(`/api/recordings/${recording.id}/results`)
            .set(analystOfT);
          expect(response.status).toBe(200);
          return response.body as RecordingResultsView;
        }),
      );
      expect(await verifyOf(t.url, await t.authHeader('admin'))).toMatchObject({ intact: true });

      // Restore into a folder that does not exist yet.
      restoredDir = join(work, 'restored', 'data');
      const restored = await restoreBackup({ backupDir, dataDir: restoredDir });
      expect(restored.audit).toMatchObject({ intact: true, firstBroken: null });
      expect(restored.audit.anchors.problems).toEqual([]);
      expect(statSync(restoredDir).mode & 0o777).toBe(0o700);
      const inRestored = tree(restoredDir);
      expect([...inRestored.keys()].sort()).toEqual(manifest.files.map((f) => f.path).sort());
      for (const file of manifest.files) {
        expect(inRestored.get(file.path)).toEqual({ sha256: file.sha256, mode: 0o600 });
      }

      // Gyre on the restored folder.
      const r = await startTestApp({ env: { DATA_DIR: restoredDir }, seed: false });
      try {
        const analyst = await signIn(r.url, t.seed.users.analyst.email);
        const admin = await signIn(r.url, t.seed.users.admin.email);
        await idle(r, 'restored');
        const after = await recordingsOf(r.url, analyst);
        // Everything restored existed in the original, with the same file and visit.
        expect(after.size).toBeGreaterThanOrEqual(baseline.length);
        for (const [id, recording] of after) {
          const original = before.get(id);
          expect(original).toBeDefined();
          expect([recording.visitId, recording.kind]).toEqual([original?.visitId, original?.kind]);
          // An upload cut off by the snapshot is rejected at start ("interrupted by a restart").
          if (recording.state === 'rejected') continue;
          expect([recording.checksumSha256, recording.sizeBytes]).toEqual([
            original?.checksumSha256,
            original?.sizeBytes,
          ]);
          const bytes = await download(r.url, `/api/recordings/${id}/file`, analyst);
          expect(sha256(bytes)).toBe(recording.checksumSha256);
        }
        // The recordings computed before the backup: same state, same run, same numbers.
        for (const [i, recording] of baseline.entries()) {
          expect(after.get(recording.id)).toMatchObject({
            state: 'ready',
            latestRunId: recording.latestRunId,
          });
          const is = await request(r.url)
            .get(`/api/recordings/${recording.id}/results`)
            .set(analyst);
          expect(is.status).toBe(200);
          expect(is.body as RecordingResultsView).toEqual(baselineResults[i]);
        }
        // Recordings caught mid-computation are picked up again and finish.
        expect(
          [...after.values()].every((rec) =>
            ['ready', 'rejected', 'superseded'].includes(rec.state),
          ),
        ).toBe(true);
        // The audit chain and its signed checkpoints hold on the restored copy.
        const audit = await verifyOf(r.url, admin);
        expect(audit).toMatchObject({ intact: true, firstBroken: null });
        expect(audit.anchors).toMatchObject({ intact: true, problems: [] });
        expect(audit.checked).toBeGreaterThanOrEqual(manifest.database.auditHead?.seq ?? 1);
        expect(audit.anchors.checkpoints).toBeGreaterThanOrEqual(1);
      } finally {
        await r.close();
      }
    },
    600_000,
  );

  it('refuses to restore into a folder with anything in it, and leaves it untouched', async () => {
    const target = join(work, 'occupied');
    mkdirSync(target);
    writeFileSync(join(target, 'notes.txt'), 'keep me');
    await expect(restoreBackup({ backupDir, dataDir: target })).rejects.toThrow(
      /is not empty .*restore only into a new or empty folder/,
    );
    expect(readdirSync(target)).toEqual(['notes.txt']);
    expect(readFileSync(join(target, 'notes.txt'), 'utf8')).toBe('keep me');
  });

  it('refuses a backup that does not match its manifest, and writes nothing', async () => {
    const copy = join(work, 'tampered');
    const restoreInto = join(work, 'never');
    const clone = async () => {
      rmSync(copy, { recursive: true, force: true });
      const { manifest: m } = await createBackup({ dataDir: t.config.dataDir, outDir: copy });
      return m;
    };

    const m = await clone();
    const stored = m.files.find((f) => f.path.startsWith('uploads/')) as { path: string };
    const bytes = readFileSync(join(copy, stored.path));
    bytes[300] ^= 0xff;
    writeFileSync(join(copy, stored.path), bytes);
    await expect(verifyBackup(copy)).rejects.toThrow(
      new RegExp(`${stored.path} does not match the manifest`),
    );

    await clone();
    appendFileSync(join(copy, 'secrets', 'planted'), 'x');
    await expect(verifyBackup(copy)).rejects.toThrow(
      /secrets\/planted is in the folder but not in the manifest/,
    );

    const withEscape = await clone();
    withEscape.files.push({ path: '../escape', bytes: 1, sha256: '0'.repeat(64) });
    writeFileSync(join(copy, 'manifest.json'), JSON.stringify(withEscape));
    await expect(restoreBackup({ backupDir: copy, dataDir: restoreInto })).rejects.toThrow(
      /unsafe or missing path "\.\.\/escape"/,
    );

    rmSync(join(copy, 'manifest.json'));
    await expect(verifyBackup(copy)).rejects.toThrow(/has no manifest\.json/);
    expect(existsSync(restoreInto)).toBe(false);
    expect(readdirSync(work).some((name) => name.includes('restoring'))).toBe(false);
  }, 60_000);

  it('refuses a backup folder that is not empty or lies inside the data folder', async () => {
    await expect(
      createBackup({ dataDir: t.config.dataDir, outDir: join(t.config.dataDir, 'backups') }),
    ).rejects.toThrow(/must lie outside the data folder/);
    await expect(createBackup({ dataDir: t.config.dataDir, outDir: backupDir })).rejects.toThrow(
      /is not empty/,
    );
    expect(existsSync(join(t.config.dataDir, 'backups'))).toBe(false);
  });
});
