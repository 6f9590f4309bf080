/**
 * What Gyre keeps on disk is its owner's only (OWASP ASVS 4.0 8.1.2 and 12.4.1: stored data
 * and uploaded files with limited permissions): the data folder and every folder in it 700,
 * every file 600 — the database with its WAL and SHM, uploads, the secret and the captured
 * mail (which holds live reset and invitation links). Checked on a real app started on a
 * data folder that an earlier, looser installation left world-readable.
 */
import {
  chmodSync,
  mkdirSync,
  mkdtempSync,
  readdirSync,
  rmSync,
  statSync,
  symlinkSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import type { RecordingView } from '@gyre/shared';
import { waitForMail } from './helpers/mail-catcher';
import { acceptedUpload } from './helpers/accepted-upload';
import { startTestApp, TestApp } from './helpers/test-app';
import { syntheticTaskEdf } from './recordings-fixtures';

const modeOf = (path: string): number => statSync(path).mode & 0o777;
const octal = (mode: number): string => mode.toString(8).padStart(3, '0');

describe('file and folder modes in DATA_DIR', () => {
  let t: TestApp;
  let dataDir: string;
  let outside: string;
  let recording: RecordingView;

  beforeAll(async () => {
    // A data folder as an older Gyre (umask 022) left it: folders 755, files 644.
    const previousUmask = process.umask(0o022);
    dataDir = mkdtempSync(join(tmpdir(), 'gyre-modes-'));
    chmodSync(dataDir, 0o755);
    for (const folder of ['secrets', 'mail', 'uploads', 'uploads/tmp']) {
      mkdirSync(join(dataDir, folder), { mode: 0o755 });
    }
    writeFileSync(join(dataDir, 'secrets', 'jwt-secret'), `${'s'.repeat(64)}\n`, { mode: 0o644 });
    writeFileSync(join(dataDir, 'mail', 'earlier.eml'), 'To: x@gyre.test\n\nold link', {
      mode: 0o644,
    });
    writeFileSync(join(dataDir, 'uploads', 'earlier.edf'), 'old', { mode: 0o644 });
    // Not Gyre's: left as it is.
    writeFileSync(join(dataDir, 'notes-of-the-operator.txt'), 'mine', { mode: 0o644 });
    // reports/ placed on another disk by the operator (followed); a link inside mail/ (not).
    outside = mkdtempSync(join(tmpdir(), 'gyre-modes-outside-'));
    chmodSync(outside, 0o755);
    mkdirSync(join(outside, 'reports'), { mode: 0o755 });
    writeFileSync(join(outside, 'reports', 'earlier.pdf'), '%PDF', { mode: 0o644 });
    writeFileSync(join(outside, 'unrelated.txt'), 'x', { mode: 0o644 });
    symlinkSync(join(outside, 'reports'), join(dataDir, 'reports'));
    symlinkSync(join(outside, 'unrelated.txt'), join(dataDir, 'mail', 'a-link'));
    process.umask(previousUmask);

    // JWT_SECRET empty: the secret is read from DATA_DIR/secrets/jwt-secret.
    t = await startTestApp({ env: { DATA_DIR: dataDir, JWT_SECRET: '' } });
    recording = await acceptedUpload(t, {
      kind: 'task',
      bytes: syntheticTaskEdf({ durationS: 10, channels: ['EEG O1-REF'], onsetsS: [3, 6] }),
    });
    const reset = await request(t.url)
      .post('/api/auth/password-reset')
      .send({ email: t.seed.users.analyst.email });
    expect(reset.status).toBeLessThan(300);
    await waitForMail(t.config.mailDir, { to: t.seed.users.analyst.email });
  });
  afterAll(async () => {
    await t.close();
    rmSync(dataDir, { recursive: true, force: true });
    rmSync(outside, { recursive: true, force: true });
  });

  it('the data folder and every folder Gyre keeps in it are 700', () => {
    for (const folder of ['', 'secrets', 'mail', 'uploads', 'uploads/tmp']) {
      expect([folder, octal(modeOf(join(dataDir, folder)))]).toEqual([folder, '700']);
    }
  });

  it('gyre.sqlite and its WAL and SHM files are 600', () => {
    for (const file of ['gyre.sqlite', 'gyre.sqlite-wal', 'gyre.sqlite-shm']) {
      expect([file, octal(modeOf(join(dataDir, file)))]).toEqual([file, '600']);
    }
  });

  it('the signing secret that was there before is now 600', () => {
    expect(t.config.jwtSecretSource).toBe('data-dir');
    expect(octal(modeOf(join(dataDir, 'secrets', 'jwt-secret')))).toBe('600');
  });

  it('the stored upload is 600, and so is the one that was there before', () => {
    expect(octal(modeOf(join(t.config.uploadsDir, `${recording.checksumSha256}.edf`)))).toBe('600');
    expect(octal(modeOf(join(t.config.uploadsDir, 'earlier.edf')))).toBe('600');
  });

  it('every captured e-mail (.eml, with its live reset link) is 600, the earlier one included', () => {
    const mails = readdirSync(t.config.mailDir).filter((name) => name.endsWith('.eml'));
    expect(mails.length).toBeGreaterThanOrEqual(2);
    for (const name of mails) {
      expect([name, octal(modeOf(join(t.config.mailDir, name)))]).toEqual([name, '600']);
    }
  });

  it('a file that is not Gyre’s is left as it was', () => {
    expect(octal(modeOf(join(dataDir, 'notes-of-the-operator.txt')))).toBe('644');
  });

  it('a Gyre folder that is a link to another disk is tightened there; a link further in is not followed', () => {
    expect(octal(modeOf(join(outside, 'reports')))).toBe('700');
    expect(octal(modeOf(join(outside, 'reports', 'earlier.pdf')))).toBe('600');
    expect(octal(modeOf(join(outside, 'unrelated.txt')))).toBe('644');
  });
});
