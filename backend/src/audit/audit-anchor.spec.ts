import { createPrivateKey, createPublicKey, generateKeyPairSync } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { compareWithTable, readAnchors, TableView } from './audit-anchor-check';
import {
  AnchorBody,
  appendLine,
  lineHash,
  parseLine,
  readLastLine,
  signedLine,
} from './audit-anchor-file';
import { keyFingerprint, signMessage, verifyMessage } from './audit-anchor-key';
import { anchorSettingsFrom } from './audit-anchor-settings';
import { GENESIS_HASH } from './audit-chain';

/** An Ed25519 private key from the 32-byte seed RFC 8032 lists as SECRET KEY (PKCS#8 DER). */
function rfc8032Key(seedHex: string) {
  const pkcs8Prefix = Buffer.from('302e020100300506032b657004220420', 'hex');
  return createPrivateKey({
    key: Buffer.concat([pkcs8Prefix, Buffer.from(seedHex, 'hex')]),
    format: 'der',
    type: 'pkcs8',
  });
}

describe('anchor signatures (RFC 8032 §7.1 test vectors)', () => {
  it('TEST 1 (empty message) and TEST 2 (one byte 0x72) give the RFC’s signatures', () => {
    const one = rfc8032Key('9d61b19deffd5a60ba844af492ec2cc44449c5697b326919703bac031cae7f60');
    expect(
      createPublicKey(one).export({ type: 'spki', format: 'der' }).subarray(12).toString('hex'),
    ).toBe('d75a980182b10ab7d54bfed3c964073a0ee172f3daa62325af021a68f707511a');
    expect(Buffer.from(signMessage(one, ''), 'base64').toString('hex')).toBe(
      'e5564300c360ac729086e2cc806e828a84877f1eb8e5d974d873e065' +
        '224901555fb8821590a33bacc61e39701cf9b46bd25bf5f0595bbe24655141438e7a100b',
    );
    const two = rfc8032Key('4ccd089b28ff96da9db6c346ec114e0f5b8a319f35aba624da8cf6ed4fb8a6fb');
    const signature = signMessage(two, 'r');
    expect(Buffer.from(signature, 'base64').toString('hex')).toBe(
      '92a009a9f0d4cab8720e820b5f642540a2b27b5416503f8fb3762223ebdb69da' +
        '085ac1e43e15996e458f3613d0f11d8c387b2eaeb4302aeeb00d291612bb0c00',
    );
    expect(verifyMessage(createPublicKey(two), 'r', signature)).toBe(true);
    expect(verifyMessage(createPublicKey(two), 's', signature)).toBe(false);
    expect(verifyMessage(createPublicKey(one), 'r', signature)).toBe(false);
  });
});

describe('anchor lines', () => {
  const { privateKey, publicKey } = generateKeyPairSync('ed25519');
  const fingerprint = keyFingerprint(publicKey);
  const hashOf = (seq: number) => seq.toString(16).padStart(64, 'a');

  /** Lines for checkpoints at the given sequence numbers, each linked to the one before. */
  function fileFor(seqs: number[]): string[] {
    const lines: string[] = [];
    for (const [i, seq] of seqs.entries()) {
      const body: AnchorBody = {
        v: 1,
        n: i + 1,
        seq,
        hash: seq === 0 ? GENESIS_HASH : hashOf(seq),
        at: `2026-01-01T00:00:0${i}.000Z`,
        reason: i === 0 ? 'key-created' : 'entries',
        prev: i === 0 ? GENESIS_HASH : lineHash(lines[i - 1]),
        key: fingerprint,
      };
      lines.push(signedLine(body, privateKey));
    }
    return lines;
  }

  const table = (lastSeq: number, changed: (seq: number) => boolean = () => false): TableView => ({
    lastSeq,
    hashAt: (seq) => (seq > lastSeq ? null : changed(seq) ? hashOf(seq + 1000) : hashOf(seq)),
  });

  const context = { publicKey, fileExists: true };

  it('an intact file over an intact table has no problems (common practice)', async () => {
    const read = await readAnchors(fileFor([0, 10, 20]), context);
    const { check, finding } = compareWithTable(read, table(25));
    expect(check).toMatchObject({ intact: true, checkpoints: 3, unanchored: 5, problems: [] });
    expect(check.latest).toMatchObject({ line: 3, seq: 20 });
    expect(finding).toBeNull();
  });

  it('a checkpoint beyond the last entry is truncation, named with its entries', async () => {
    const read = await readAnchors(fileFor([0, 10, 20]), context);
    const { check, finding } = compareWithTable(read, table(17));
    expect(check.intact).toBe(false);
    expect(check.problems[0]).toMatch(/truncated.*#18 to #20 were deleted/);
    expect(finding).toMatchObject({ seq: 18 });
  });

  it('a different hash at a checkpoint is a rewrite, bracketed by the last matching one', async () => {
    const read = await readAnchors(fileFor([0, 10, 20, 30]), context);
    const { check, finding } = compareWithTable(
      read,
      table(35, (seq) => seq >= 14),
    );
    expect(check.problems[0]).toMatch(/rewritten: entry #20 no longer has the hash/);
    expect(check.problems[0]).toMatch(/between #11 and #20/);
    expect(check.problems[0]).toMatch(/2 checkpoints in all/);
    expect(finding).toMatchObject({ seq: 11 });
  });

  it('a forged, re-signed, reordered or cut-off line is named by its line number', async () => {
    const lines = fileFor([0, 10, 20]);
    const tampered = JSON.parse(lines[2]) as Record<string, unknown>;
    tampered.seq = 15;
    const other = generateKeyPairSync('ed25519');
    const foreign = signedLine(
      { ...(JSON.parse(lines[1]) as AnchorBody), key: keyFingerprint(other.publicKey) },
      other.privateKey,
    );
    const read = await readAnchors(
      [lines[0], lines[2], JSON.stringify(tampered), foreign, '{"v":1,"n":'],
      context,
    );
    expect(read.problems).toEqual([
      expect.stringMatching(/^Line 2 .* does not link to the line before it/),
      expect.stringMatching(/^Line 3 .* is not signed by Gyre's anchor key/),
      expect.stringMatching(/^Line 4 .* names another signing key/),
      expect.stringMatching(/^Line 5 .* is not a checkpoint \(it is not JSON\)/),
    ]);
    expect(read.checkpoints.map((c) => c.seq)).toEqual([0, 20]);
  });

  it('parses only complete lines with every field', () => {
    expect(parseLine('[]')).toEqual({ error: 'it is not a JSON object' });
    expect(parseLine('{"v":1}')).toMatchObject({ error: expect.stringMatching(/field n, seq/) });
    expect(parseLine(fileFor([0])[0])).toHaveProperty('line.seq', 0);
  });

  it('appends on a line of its own after a cut-off line, and reads the last line back', () => {
    const dir = mkdtempSync(join(tmpdir(), 'gyre-anchor-'));
    try {
      const file = join(dir, 'a.jsonl');
      const [first, second] = fileFor([0, 10]);
      writeFileSync(file, `${first}\n{"v":1,"n"`);
      appendLine(file, second);
      expect(readFileSync(file, 'utf8')).toBe(`${first}\n{"v":1,"n"\n${second}\n`);
      expect(readLastLine(file)).toMatchObject({ raw: second, n: 2 });
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('anchor settings', () => {
  it('default to every 100 entries and every 60 s, and refuse a bad value by name', () => {
    expect(anchorSettingsFrom({})).toEqual({ everyEntries: 100, everySeconds: 60 });
    expect(
      anchorSettingsFrom({ AUDIT_ANCHOR_EVERY_ENTRIES: '5', AUDIT_ANCHOR_EVERY_SECONDS: '2' }),
    ).toEqual({ everyEntries: 5, everySeconds: 2 });
    expect(() => anchorSettingsFrom({ AUDIT_ANCHOR_EVERY_SECONDS: '0' })).toThrow(
      /AUDIT_ANCHOR_EVERY_SECONDS: "0" found/,
    );
    expect(() => anchorSettingsFrom({ AUDIT_ANCHOR_EVERY_ENTRIES: '1e3' })).toThrow(
      /AUDIT_ANCHOR_EVERY_ENTRIES/,
    );
  });
});
