import {
  createHash,
  createPrivateKey,
  createPublicKey,
  generateKeyPairSync,
  KeyObject,
  sign,
  verify,
} from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

/**
 * The Ed25519 key (RFC 8032) that signs audit checkpoints. Asymmetric rather than HMAC: anyone
 * holding only the public key (a monitor, an auditor) can check the anchor file, and checking
 * never needs the secret that would also let them forge lines.
 */
export interface AnchorKey {
  privateKey: KeyObject;
  publicKey: KeyObject;
  /** SHA-256 (hex) of the public key's SubjectPublicKeyInfo DER. */
  fingerprint: string;
  /** Created by this call (first start), rather than read from the file. */
  generated: boolean;
}

/** SHA-256 (hex) of a public key's SubjectPublicKeyInfo DER: what lines name as `key`. */
export function keyFingerprint(publicKey: KeyObject): string {
  return createHash('sha256')
    .update(publicKey.export({ type: 'spki', format: 'der' }))
    .digest('hex');
}

/** Reads the PKCS#8 PEM key, or creates it (folder 0700, file 0600, never overwritten). */
export function loadOrCreateAnchorKey(keyFile: string): AnchorKey {
  if (!existsSync(keyFile)) {
    mkdirSync(dirname(keyFile), { recursive: true, mode: 0o700 });
    const { privateKey } = generateKeyPairSync('ed25519');
    const pem = privateKey.export({ type: 'pkcs8', format: 'pem' });
    try {
      // 'wx': another process that created the key first wins; we then read its key below.
      writeFileSync(keyFile, pem, { mode: 0o600, flag: 'wx' });
      chmodSync(keyFile, 0o600);
      return withPublic(privateKey, true);
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
    }
  }
  return withPublic(createPrivateKey(readFileSync(keyFile)), false);
}

/** The public half of a stored key, or null when the file is missing. */
export function readAnchorPublicKey(keyFile: string): KeyObject | null {
  if (!existsSync(keyFile)) return null;
  return createPublicKey(createPrivateKey(readFileSync(keyFile)));
}

function withPublic(privateKey: KeyObject, generated: boolean): AnchorKey {
  if (privateKey.asymmetricKeyType !== 'ed25519') {
    throw new Error(`The audit anchor key is ${privateKey.asymmetricKeyType}, Ed25519 expected`);
  }
  const publicKey = createPublicKey(privateKey);
  return { privateKey, publicKey, fingerprint: keyFingerprint(publicKey), generated };
}

/** Ed25519 signature (RFC 8032 §5.1.6; no pre-hash, so the algorithm argument is null), base64. */
export function signMessage(privateKey: KeyObject, message: string): string {
  return sign(null, Buffer.from(message, 'utf8'), privateKey).toString('base64');
}

export function verifyMessage(publicKey: KeyObject, message: string, signature: string): boolean {
  const bytes = Buffer.from(signature, 'base64');
  // Ed25519 signatures are 64 bytes (RFC 8032 §5.1.6); anything else cannot verify.
  if (bytes.length !== 64) return false;
  return verify(null, Buffer.from(message, 'utf8'), publicKey, bytes);
}
