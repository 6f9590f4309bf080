import { createHash } from 'node:crypto';

/** The `prevHash` of the first entry. */
export const GENESIS_HASH = '0'.repeat(64);

/**
 * Canonical JSON: object keys sorted by code unit, no whitespace, `undefined` members dropped,
 * dates as ISO strings. Same value, same text, whatever the key order it was built with.
 */
export function canonicalJson(value: unknown): string {
  return JSON.stringify(normalise(value));
}

function normalise(value: unknown): unknown {
  if (value === null || value === undefined) return null;
  if (value instanceof Date) return value.toISOString();
  if (typeof value === 'bigint') return value.toString();
  if (Array.isArray(value)) return value.map((item) => normalise(item));
  if (typeof value === 'object') {
    const out: Record<string, unknown> = {};
    for (const key of Object.keys(value).sort()) {
      const member = (value as Record<string, unknown>)[key];
      if (member !== undefined) out[key] = normalise(member);
    }
    return out;
  }
  if (typeof value === 'number' && !Number.isFinite(value)) return String(value);
  return value;
}

/** The fields an entry's hash covers: everything but the two hashes. */
export interface ChainedContent {
  seq: number;
  at: string;
  actorId: string | null;
  actorEmail: string | null;
  action: string;
  objectType: string;
  objectId: string | null;
  studyId: string | null;
  siteId: string | null;
  /** Canonical JSON text as stored. */
  before: string | null;
  after: string | null;
  reason: string | null;
  clientIp: string | null;
}

/** hash = SHA-256(prevHash ‖ canonical JSON of the content), hex. */
export function chainHash(prevHash: string, content: ChainedContent): string {
  return createHash('sha256')
    .update(prevHash, 'utf8')
    .update(canonicalJson(content), 'utf8')
    .digest('hex');
}
