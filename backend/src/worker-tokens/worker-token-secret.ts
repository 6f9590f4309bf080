import { createHash, randomUUID, timingSafeEqual } from 'node:crypto';
import { hashTokenSecret, newTokenSecret } from '../auth/token-secrets';

/**
 * A worker token reads `gyre_wt_<id>.<secret>`: the prefix says what it is (and lets the
 * sign-in guard tell it from a user's JWT), the id selects the row, the secret (256 random
 * bits, base64url) is what proves it. Selecting by id and comparing SHA-256 digests with
 * timingSafeEqual keeps the secret out of any index lookup whose timing could leak it.
 */
export const WORKER_TOKEN_PREFIX = 'gyre_wt_';

const UUID = '[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}';
/** 32 bytes in base64url without padding are 43 characters (RFC 4648 §5). */
const SECRET = '[A-Za-z0-9_-]{43}';
const TOKEN = new RegExp(`^${WORKER_TOKEN_PREFIX}(${UUID})\\.(${SECRET})$`);

export interface NewWorkerToken {
  id: string;
  /** The whole bearer value, handed out once. */
  token: string;
  /** What the database keeps. */
  secretHash: string;
}

export function newWorkerToken(): NewWorkerToken {
  const id = randomUUID();
  const secret = newTokenSecret();
  return {
    id,
    token: `${WORKER_TOKEN_PREFIX}${id}.${secret}`,
    secretHash: hashTokenSecret(secret),
  };
}

/** The id and secret of a presented token, or null when it is not a well-formed worker token. */
export function parseWorkerToken(token: string): { id: string; secret: string } | null {
  const match = TOKEN.exec(token);
  return match === null ? null : { id: match[1], secret: match[2] };
}

/** Whether `secret` hashes to `storedHash`, in time that does not depend on where they differ. */
export function secretMatches(secret: string, storedHash: string): boolean {
  const presented = createHash('sha256').update(secret, 'utf8').digest();
  const stored = Buffer.from(storedHash, 'hex');
  return stored.length === presented.length && timingSafeEqual(presented, stored);
}

/**
 * The worker token in an `Authorization: Bearer …` header (scheme case-insensitive, RFC 7235
 * §2.1), or null when the header carries something else (a user's JWT) or nothing.
 */
export function workerTokenInHeader(header: string | undefined): string | null {
  if (header === undefined) return null;
  const match = /^bearer +(\S+)\s*$/i.exec(header);
  if (match === null || !match[1].startsWith(WORKER_TOKEN_PREFIX)) return null;
  return match[1];
}
