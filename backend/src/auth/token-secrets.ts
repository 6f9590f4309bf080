import { createHash, randomBytes } from 'node:crypto';

/** A fresh 256-bit secret, URL-safe, to hand out once (cookie or e-mailed link). */
export function newTokenSecret(): string {
  return randomBytes(32).toString('base64url');
}

/** What the database keeps instead of the secret. */
export function hashTokenSecret(secret: string): string {
  return createHash('sha256').update(secret, 'utf8').digest('hex');
}
