import { createHash } from 'node:crypto';
import { canonicalJson, chainHash, ChainedContent, GENESIS_HASH } from './audit-chain';
import { csvField } from './audit-csv';

describe('canonicalJson', () => {
  it('gives the same text whatever the key order, nested too', () => {
    expect(canonicalJson({ b: 1, a: { d: [1, { y: 2, x: 1 }], c: null } })).toBe(
      canonicalJson({ a: { c: null, d: [1, { x: 1, y: 2 }] }, b: 1 }),
    );
    expect(canonicalJson({ b: 1, a: 2 })).toBe('{"a":2,"b":1}');
  });

  it('drops undefined members and writes dates as ISO 8601', () => {
    expect(canonicalJson({ a: undefined, at: new Date('2026-01-02T03:04:05.000Z') })).toBe(
      '{"at":"2026-01-02T03:04:05.000Z"}',
    );
  });
});

describe('chainHash', () => {
  const content: ChainedContent = {
    seq: 1,
    at: '2026-01-01T00:00:00.000Z',
    actorId: 'u1',
    actorEmail: 'a@b.c',
    action: 'create',
    objectType: 'Study',
    objectId: 's1',
    studyId: 's1',
    siteId: null,
    before: null,
    after: '{"code":"X1"}',
    reason: null,
    clientIp: '127.0.0.1',
  };

  it('is SHA-256 (FIPS 180-4) of the previous hash followed by the canonical JSON', () => {
    const expected = createHash('sha256')
      .update(GENESIS_HASH + canonicalJson(content))
      .digest('hex');
    expect(chainHash(GENESIS_HASH, content)).toBe(expected);
  });

  it('changes when any field or the previous hash changes', () => {
    const base = chainHash(GENESIS_HASH, content);
    expect(chainHash(GENESIS_HASH, { ...content, reason: 'x' })).not.toBe(base);
    expect(chainHash(GENESIS_HASH, { ...content, seq: 2 })).not.toBe(base);
    expect(chainHash('1'.repeat(64), content)).not.toBe(base);
  });
});

describe('csvField (RFC 4180 quoting)', () => {
  it('quotes commas, quotes and line breaks, doubling inner quotes', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('a,b')).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
    expect(csvField(null)).toBe('');
    expect(csvField({ a: 1 })).toBe('"{""a"":1}"');
  });

  it('defuses text a spreadsheet would run as a formula (OWASP CSV injection)', () => {
    expect(csvField('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvField('+1')).toBe("'+1");
    expect(csvField('@sum')).toBe("'@sum");
    expect(csvField(-3)).toBe('-3');
  });
});
