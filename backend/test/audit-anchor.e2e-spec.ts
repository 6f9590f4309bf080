/**
 * The audit chain anchored outside the database: signed checkpoints in
 * DATA_DIR/audit-anchors.jsonl, and GET /api/audit/verify holding the table against them.
 * Sources: RFC 8032 (Ed25519; every signature is checked here with node:crypto and the public
 * key, independently of the server's code); OWASP ASVS 4.0 V7.3.3 ("security logs are protected
 * from unauthorized access and modification"). Tampering is simulated the way someone with the
 * database file would do it: the append-only triggers dropped, rows deleted or rewritten.
 */
import {
  createHash,
  createPublicKey,
  generateKeyPairSync,
  KeyObject,
  sign,
  verify,
} from 'node:crypto';
import {
  appendFileSync,
  existsSync,
  mkdtempSync,
  readFileSync,
  rmSync,
  statSync,
  unlinkSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import type { AuditVerifyResult } from '@gyre/shared';
import { openSqliteFile } from '../src/audit/sqlite-file';
import { startTestApp, TestApp } from './helpers/test-app';
import { textBody } from './helpers/binary-body';

const KEY_FILE = 'secrets/audit-anchor-ed25519.pem';
const ANCHOR_FILE = 'audit-anchors.jsonl';

interface Line {
  v: number;
  n: number;
  seq: number;
  hash: string;
  at: string;
  reason: string;
  prev: string;
  key: string;
  sig: string;
}

/** Starts an app with the anchor settings in the environment the service reads them from. */
async function startWith(settings: Record<string, string>, env: Record<string, string> = {}) {
  const saved = Object.fromEntries(Object.keys(settings).map((k) => [k, process.env[k]]));
  Object.assign(process.env, settings);
  try {
    return await startTestApp({ env });
  } finally {
    for (const [k, v] of Object.entries(saved)) {
      if (v === undefined) delete process.env[k];
      else process.env[k] = v;
    }
  }
}

/** Runs `body` on an app started with the anchor `settings`, and closes it even when it fails. */
async function withAppStartedWith(
  settings: Record<string, string>,
  body: (t: TestApp) => Promise<void>,
): Promise<void> {
  const t = await startWith(settings);
  try {
    await body(t);
  } finally {
    await t.close();
  }
}

const FREQUENT = { AUDIT_ANCHOR_EVERY_ENTRIES: '5', AUDIT_ANCHOR_EVERY_SECONDS: '1' };

function rawLines(dataDir: string): string[] {
  const file = join(dataDir, ANCHOR_FILE);
  if (!existsSync(file)) return [];
  return readFileSync(file, 'utf8').replace(/\n$/, '').split('\n');
}

function lines(dataDir: string): Line[] {
  return rawLines(dataDir).map((raw) => JSON.parse(raw) as Line);
}

const sha256 = (text: string) => createHash('sha256').update(text, 'utf8').digest('hex');

/** Canonical JSON of a flat object (keys sorted), as the anchor format specifies. */
const canonical = (value: Record<string, unknown>) =>
  JSON.stringify(Object.fromEntries(Object.entries(value).sort(([a], [b]) => (a < b ? -1 : 1))));

const messageOf = (line: Omit<Line, 'sig'>) => `gyre-audit-anchor-v1\n${canonical({ ...line })}`;

/** RFC 8032 verification with node:crypto: the line's body under the public key. */
function signatureHolds(raw: string, publicKey: KeyObject): boolean {
  const { sig, ...body } = JSON.parse(raw) as Line;
  return verify(null, Buffer.from(messageOf(body)), publicKey, Buffer.from(sig, 'base64'));
}

function publicKeyOf(dataDir: string): KeyObject {
  return createPublicKey(readFileSync(join(dataDir, KEY_FILE)));
}

async function waitFor<T>(what: string, probe: () => T | undefined | false, ms = 10_000) {
  const until = Date.now() + ms;
  for (;;) {
    const value = probe();
    if (value !== undefined && value !== false) return value;
    if (Date.now() > until) throw new Error(`Timed out waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

async function lastSeq(t: TestApp): Promise<number> {
  const [row] = (await t.dataSource.query(`SELECT MAX("seq") AS "seq" FROM "audit_entry"`)) as {
    seq: number | null;
  }[];
  return row.seq ?? 0;
}

let codes = 0;
/** One audited change each (a participant created by the A1 technician). */
async function makeEntries(t: TestApp, count: number): Promise<void> {
  const technician = await t.authHeader('technician');
  for (let i = 0; i < count; i += 1) {
    codes += 1;
    const response = await request(t.url)
      .post('/api/participants')
      .set(technician)
      .send({ code: `AN-${String(codes).padStart(4, '0')}` });
    expect(response.status).toBe(201);
  }
}

/** Waits until the newest entry is anchored, and returns its sequence number. */
async function anchoredHead(t: TestApp): Promise<number> {
  const head = await lastSeq(t);
  await waitFor(`a checkpoint of #${head}`, () => lines(t.config.dataDir).at(-1)?.seq === head);
  return head;
}

async function verifyAs(t: TestApp, user: 'admin' | 'monitor' = 'admin') {
  const response = await request(t.url)
    .get('/api/audit/verify')
    .set(await t.authHeader(user));
  expect(response.status).toBe(200);
  return response.body as AuditVerifyResult;
}

/** hash = SHA-256(prevHash ‖ canonical JSON of the content), recomputed here for a rewrite. */
function rehash(
  prevHash: string,
  row: Record<string, string | number | null>,
): { prevHash: string; hash: string } {
  const content = Object.fromEntries(
    Object.entries(row).filter(([k]) => k !== 'prevHash' && k !== 'hash'),
  );
  return { prevHash, hash: sha256(prevHash + canonical(content)) };
}

describe('audit anchors: key, file and checks on an intact trail', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startWith(FREQUENT);
    await t.authHeader('admin');
    await t.authHeader('monitor');
  });
  afterAll(async () => {
    await t.close();
  });

  it('generates the Ed25519 key on first start (0600 in a 0700 folder) and writes line 1', () => {
    const dataDir = t.config.dataDir;
    expect(statSync(join(dataDir, KEY_FILE)).mode & 0o777).toBe(0o600);
    expect(statSync(join(dataDir, 'secrets')).mode & 0o777).toBe(0o700);
    expect(statSync(join(dataDir, ANCHOR_FILE)).mode & 0o777).toBe(0o600);
    expect(publicKeyOf(dataDir).asymmetricKeyType).toBe('ed25519');
    const [first] = lines(dataDir);
    expect(first).toMatchObject({ v: 1, n: 1, seq: 0, reason: 'key-created' });
    expect(first.prev).toBe('0'.repeat(64));
  });

  it('anchors every N entries; each line is signed (RFC 8032) and links to the one before', async () => {
    await makeEntries(t, 12);
    const head = await anchoredHead(t);
    const raws = rawLines(t.config.dataDir);
    const parsed = raws.map((raw) => JSON.parse(raw) as Line);
    expect(parsed.some((line) => line.reason === 'entries')).toBe(true);
    const publicKey = publicKeyOf(t.config.dataDir);
    const fingerprint = sha256Hex(publicKey.export({ type: 'spki', format: 'der' }));
    for (const [i, raw] of raws.entries()) {
      expect(signatureHolds(raw, publicKey)).toBe(true);
      expect(parsed[i].n).toBe(i + 1);
      expect(parsed[i].key).toBe(fingerprint);
      expect(parsed[i].prev).toBe(i === 0 ? '0'.repeat(64) : sha256(raws[i - 1]));
    }
    // Each checkpoint's hash is the stored hash of the entry it names (common practice).
    for (const line of parsed.filter((l) => l.seq > 0)) {
      const [row] = (await t.dataSource.query(`SELECT "hash" FROM "audit_entry" WHERE "seq" = ?`, [
        line.seq,
      ])) as { hash: string }[];
      expect(row.hash).toBe(line.hash);
    }
    expect(parsed.at(-1)?.seq).toBe(head);
  });

  it('an intact trail passes, with the latest checkpoint and the key fingerprint reported', async () => {
    const head = await anchoredHead(t);
    const result = await verifyAs(t, 'monitor');
    expect(result).toMatchObject({ intact: true, firstBroken: null, checked: head });
    expect(result.anchors).toMatchObject({ intact: true, problems: [], unanchored: 0 });
    expect(result.anchors.latest?.seq).toBe(head);
    expect(result.anchors.checkpoints).toBe(rawLines(t.config.dataDir).length);
    expect(result.anchors.keyFingerprint).toBe(
      sha256Hex(publicKeyOf(t.config.dataDir).export({ type: 'spki', format: 'der' })),
    );
  });

  it('the monitor downloads the anchors as stored and the public key; the download is audited', async () => {
    const monitor = await t.authHeader('monitor');
    const storedBefore = readFileSync(join(t.config.dataDir, ANCHOR_FILE), 'utf8');
    const download = await request(t.url)
      .get('/api/audit/anchors.jsonl')
      .set(monitor)
      .buffer(true)
      .parse(textBody);
    expect(download.status).toBe(200);
    expect(download.headers['content-type']).toMatch(/^application\/x-ndjson/);
    expect(download.headers['content-disposition']).toMatch(/gyre-audit-anchors-.*\.jsonl/);
    // The file only grows (an interval checkpoint may land while the download runs): the
    // download is the file as stored at one moment, whole lines, between the two reads.
    const storedAfter = readFileSync(join(t.config.dataDir, ANCHOR_FILE), 'utf8');
    const body = download.body as string;
    expect(body.startsWith(storedBefore)).toBe(true);
    expect(storedAfter.startsWith(body)).toBe(true);
    expect(body.endsWith('\n')).toBe(true);
    const pem = await request(t.url).get('/api/audit/anchor-key.pem').set(monitor);
    expect(pem.status).toBe(200);
    const fromApi = createPublicKey(pem.text);
    for (const raw of rawLines(t.config.dataDir)) expect(signatureHolds(raw, fromApi)).toBe(true);
    expect(download.headers['x-gyre-anchor-key-sha256']).toBe(
      sha256Hex(fromApi.export({ type: 'spki', format: 'der' })),
    );
    const exports = await request(t.url).get('/api/audit').query({ action: 'export' }).set(monitor);
    expect(exports.body.items[0].after).toEqual({ format: 'anchors-jsonl' });
    // The CSV keeps its columns: the anchors are a separate download (common practice).
    const csv = await request(t.url).get('/api/audit/export.csv').set(monitor);
    expect(csv.text.split('\r\n')[0]).toBe(
      'seq,at,actorId,actorEmail,action,objectType,objectId,studyId,siteId,reason,clientIp,before,after,prevHash,hash',
    );
    // Who may not export the trail may not download its anchors either (OWASP ASVS 4.0 V4.1.3).
    const coordinator = await request(t.url)
      .get('/api/audit/anchors.jsonl')
      .set(await t.authHeader('coordinator'));
    expect(coordinator.status).toBe(403);
  });
});

function sha256Hex(bytes: Buffer | string): string {
  return createHash('sha256').update(bytes).digest('hex');
}

describe('audit anchors: what verify reports after tampering', () => {
  let t: TestApp;
  beforeEach(async () => {
    t = await startWith(FREQUENT);
    // Sign in first: a later sign-in would append an entry of its own.
    await t.authHeader('admin');
    await makeEntries(t, 9);
  });
  afterEach(async () => {
    await t.close();
  });

  it('reports truncation when the newest entries are deleted', async () => {
    const head = await anchoredHead(t);
    await t.dataSource.query(`DROP TRIGGER "audit_entry_no_delete"`);
    await t.dataSource.query(`DELETE FROM "audit_entry" WHERE "seq" > ?`, [head - 3]);
    const result = await verifyAs(t);
    // Today's checks alone pass: what is left is a valid chain.
    expect(result.checked).toBe(head - 3);
    expect(result.intact).toBe(false);
    expect(result.firstBroken?.seq).toBe(head - 2);
    expect(result.firstBroken?.reason).toMatch(
      new RegExp(`entries #${head - 2} to #${head} were deleted from the end of the trail`),
    );
    expect(result.anchors.intact).toBe(false);
    expect(result.anchors.problems).toEqual([
      expect.stringMatching(
        new RegExp(
          `^The trail was truncated: the signed checkpoint on line \\d+ .* records entry #${head}, but the table ends at #${head - 3}`,
        ),
      ),
    ]);
    // The server itself does not anchor the shortened trail (common practice).
    await new Promise((resolve) => setTimeout(resolve, 1500));
    expect(lines(t.config.dataDir).at(-1)?.seq).toBe(head);
  });

  it('reports a whole chain rewritten and re-hashed consistently', async () => {
    const head = await anchoredHead(t);
    await t.dataSource.query(`DROP TRIGGER "audit_entry_no_update"`);
    const rows = (await t.dataSource.query(`SELECT * FROM "audit_entry" ORDER BY "seq"`)) as Record<
      string,
      string | number | null
    >[];
    let prevHash = '0'.repeat(64);
    for (const row of rows) {
      if (row.seq === 2) row.reason = 'quietly rewritten';
      const next = rehash(prevHash, row);
      await t.dataSource.query(
        `UPDATE "audit_entry" SET "reason" = ?, "prevHash" = ?, "hash" = ? WHERE "seq" = ?`,
        [row.reason, next.prevHash, next.hash, row.seq],
      );
      prevHash = next.hash;
    }
    const result = await verifyAs(t);
    // Every entry still hashes to what the next links to: today's checks alone pass.
    expect(result.checked).toBe(head);
    expect(result.intact).toBe(false);
    // The first entry no checkpoint vouches for any more (the timer may have anchored #1).
    expect(result.firstBroken?.seq).toBeGreaterThanOrEqual(1);
    expect(result.firstBroken?.seq).toBeLessThanOrEqual(2);
    expect(result.firstBroken?.reason).toMatch(/rewritten and re-hashed/);
    expect(result.anchors.problems).toEqual([
      expect.stringMatching(
        /^The trail was rewritten: entry #\d+ no longer has the hash the signed checkpoint on line \d+ .* records/,
      ),
    ]);
  });

  it('reports a forged line, a line signed with another key and an altered line', async () => {
    const head = await anchoredHead(t);
    const file = join(t.config.dataDir, ANCHOR_FILE);
    const original = readFileSync(file, 'utf8');
    const raws = rawLines(t.config.dataDir);
    const last = JSON.parse(raws.at(-1) as string) as Line;
    const forward = { ...last, n: last.n + 1, prev: sha256(raws.at(-1) as string) };

    // A checkpoint that would hide deleted entries, with a copied signature.
    appendFileSync(file, `${canonical({ ...forward, seq: head + 50 })}\n`);
    let result = await verifyAs(t);
    expect(result.intact).toBe(false);
    expect(result.anchors.problems).toEqual([
      `Line ${last.n + 1} of the anchor file is not signed by Gyre's anchor key: it was forged or altered; its checkpoint is ignored.`,
    ]);
    // Ignored: it does not make the trail look truncated.
    expect(result.firstBroken).toBeNull();

    // Properly signed, but with a key of the attacker's own (RFC 8032 signature).
    const other = generateKeyPairSync('ed25519');
    const body = {
      ...forward,
      seq: head + 50,
      key: sha256Hex(other.publicKey.export({ type: 'spki', format: 'der' })),
    };
    const { sig: _sig, ...unsigned } = body;
    const sig = sign(null, Buffer.from(messageOf(unsigned)), other.privateKey).toString('base64');
    writeFileSync(file, `${original}${canonical({ ...unsigned, sig })}\n`);
    result = await verifyAs(t);
    expect(result.anchors.problems).toEqual([
      expect.stringMatching(
        new RegExp(`^Line ${last.n + 1} of the anchor file names another signing key`),
      ),
    ]);

    // An existing line altered in place: its signature fails and the next line's link breaks.
    const altered = raws.map((raw, i) =>
      i === 1 ? canonical({ ...(JSON.parse(raw) as Line), at: '2020-01-01T00:00:00.000Z' }) : raw,
    );
    writeFileSync(file, `${altered.join('\n')}\n`);
    result = await verifyAs(t);
    expect(result.anchors.problems).toEqual([
      "Line 2 of the anchor file is not signed by Gyre's anchor key: it was forged or altered; its checkpoint is ignored.",
      'Line 3 of the anchor file does not link to the line before it (its previous-line hash differs): lines were removed, inserted or altered.',
    ]);

    writeFileSync(file, original);
    result = await verifyAs(t);
    expect(result.intact).toBe(true);
  });
});

describe('audit anchors: when checkpoints are written', () => {
  const dirs: string[] = [];
  afterAll(() => {
    for (const dir of dirs) rmSync(dir, { recursive: true, force: true });
  });

  it('every N entries (AUDIT_ANCHOR_EVERY_ENTRIES), without waiting for the timer', async () => {
    await withAppStartedWith(
      { AUDIT_ANCHOR_EVERY_ENTRIES: '4', AUDIT_ANCHOR_EVERY_SECONDS: '3600' },
      async (t) => {
        await t.authHeader('technician');
        await makeEntries(t, 5);
        const line = await waitFor('an entries checkpoint', () =>
          lines(t.config.dataDir).find((l) => l.reason === 'entries'),
        );
        expect(line.seq).toBeGreaterThanOrEqual(4);
      },
    );
  });

  it('every M seconds (AUDIT_ANCHOR_EVERY_SECONDS) while entries arrive, none when idle', async () => {
    await withAppStartedWith(
      { AUDIT_ANCHOR_EVERY_ENTRIES: '1000', AUDIT_ANCHOR_EVERY_SECONDS: '1' },
      async (t) => {
        await makeEntries(t, 2);
        const head = await lastSeq(t);
        // The start itself appends entries (the local worker token), which an earlier interval
        // checkpoint may have anchored: wait for the one that covers the newest entry.
        const line = await waitFor('an interval checkpoint', () =>
          lines(t.config.dataDir).find((l) => l.reason === 'interval' && l.seq === head),
        );
        expect(line.seq).toBe(head);
        const count = lines(t.config.dataDir).length;
        await new Promise((resolve) => setTimeout(resolve, 2200));
        expect(lines(t.config.dataDir)).toHaveLength(count);
      },
    );
  });

  it('reports a deleted anchor file, and the new file Gyre then starts says why', async () => {
    await withAppStartedWith(
      { AUDIT_ANCHOR_EVERY_ENTRIES: '5', AUDIT_ANCHOR_EVERY_SECONDS: '3600' },
      async (t) => {
        await t.authHeader('admin');
        unlinkSync(join(t.config.dataDir, ANCHOR_FILE));
        const missing = await verifyAs(t);
        expect(missing.intact).toBe(false);
        expect(missing.anchors.problems).toEqual([
          expect.stringMatching(/^The anchor file \(audit-anchors\.jsonl\) is missing or empty/),
        ]);
        // The next checkpoint (here: after five entries) starts a new file and marks it.
        await makeEntries(t, 5);
        const [first] = await waitFor('a new anchor file', () => {
          const found = lines(t.config.dataDir);
          return found.length > 0 ? found : undefined;
        });
        expect(first).toMatchObject({ n: 1, reason: 'file-missing' });
        const restarted = await verifyAs(t);
        expect(restarted.intact).toBe(false);
        expect(restarted.anchors.problems).toEqual([
          expect.stringMatching(
            /^Line 1 of the anchor file: Gyre started a new anchor file on .* because the previous one was missing/,
          ),
        ]);
      },
    );
  });

  it('at clean shutdown, anchoring the last entry', async () => {
    const dataDir = mkdtempSync(join(tmpdir(), 'gyre-anchor-shutdown-'));
    dirs.push(dataDir);
    const t = await startWith(
      { AUDIT_ANCHOR_EVERY_ENTRIES: '1000', AUDIT_ANCHOR_EVERY_SECONDS: '3600' },
      { DATA_DIR: dataDir },
    );
    await makeEntries(t, 3);
    expect(lines(dataDir)).toHaveLength(1);
    await t.close();
    const db = openSqliteFile(join(dataDir, 'gyre.sqlite'), { fileMustExist: true });
    const head = db.prepare(`SELECT "seq", "hash" FROM "audit_entry" ORDER BY "seq" DESC`).get();
    db.close();
    const last = lines(dataDir).at(-1);
    expect(last).toMatchObject({ reason: 'shutdown', ...(head as object) });
    expect(signatureHolds(rawLines(dataDir).at(-1) as string, publicKeyOf(dataDir))).toBe(true);
  });
});
