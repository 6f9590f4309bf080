import { createCipheriv, createDecipheriv, createHash, hkdfSync, randomBytes } from 'node:crypto';

/** A fresh 256-bit secret, URL-safe, to hand out once (cookie or e-mailed link). */
export function newTokenSecret(): string {
  return randomBytes(32).toString('base64url');
}

/** What the database keeps instead of the secret. */
export function hashTokenSecret(secret: string): string {
  return createHash('sha256').update(secret, 'utf8').digest('hex');
}

const SEAL_INFO = 'gyre refresh-token successor v1';
const IV_BYTES = 12;
const TAG_BYTES = 16;

// HKDF (RFC 5869) keeps this key independent of the SHA-256 the database stores.
function sealingKey(predecessorSecret: string): Buffer {
  return Buffer.from(hkdfSync('sha256', predecessorSecret, Buffer.alloc(0), SEAL_INFO, 32));
}

/**
 * Seals a successor's secret (AES-256-GCM) under a key only the holder of the predecessor's
 * secret can derive: the database alone never yields a live refresh token.
 */
export function sealSuccessor(predecessorSecret: string, successorSecret: string): string {
  const iv = randomBytes(IV_BYTES);
  const cipher = createCipheriv('aes-256-gcm', sealingKey(predecessorSecret), iv);
  const body = Buffer.concat([cipher.update(successorSecret, 'utf8'), cipher.final()]);
  return Buffer.concat([iv, cipher.getAuthTag(), body]).toString('base64url');
}

/** The successor's secret, or null when `sealed` was not sealed with this secret. */
export function openSuccessor(predecessorSecret: string, sealed: string): string | null {
  const bytes = Buffer.from(sealed, 'base64url');
  if (bytes.length <= IV_BYTES + TAG_BYTES) return null;
  try {
    const decipher = createDecipheriv(
      'aes-256-gcm',
      sealingKey(predecessorSecret),
      bytes.subarray(0, IV_BYTES),
    );
    decipher.setAuthTag(bytes.subarray(IV_BYTES, IV_BYTES + TAG_BYTES));
    const plain = Buffer.concat([
      decipher.update(bytes.subarray(IV_BYTES + TAG_BYTES)),
      decipher.final(),
    ]);
    return plain.toString('utf8');
  } catch {
    return null;
  }
}
