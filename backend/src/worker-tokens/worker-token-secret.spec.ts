import { createHash } from 'node:crypto';
import {
  newWorkerToken,
  parseWorkerToken,
  secretMatches,
  WORKER_TOKEN_PREFIX,
  workerTokenInHeader,
} from './worker-token-secret';

describe('worker token secrets', () => {
  it('carries 256 random bits and stores their SHA-256', () => {
    const issued = newWorkerToken();
    const parsed = parseWorkerToken(issued.token);
    expect(parsed?.id).toBe(issued.id);
    // RFC 4648 §5: 43 base64url characters without padding decode to 32 bytes.
    expect(Buffer.from(parsed?.secret ?? '', 'base64url')).toHaveLength(32);
    // FIPS 180-4 SHA-256, computed independently by Node's OpenSSL binding.
    expect(issued.secretHash).toBe(
      createHash('sha256')
        .update(parsed?.secret ?? '')
        .digest('hex'),
    );
    expect(issued.token).not.toContain(issued.secretHash);
  });

  it('gives every token its own id and secret', () => {
    const tokens = new Set(Array.from({ length: 100 }, () => newWorkerToken().token));
    expect(tokens.size).toBe(100);
  });

  it('compares the secret against the stored hash', () => {
    const issued = newWorkerToken();
    const secret = parseWorkerToken(issued.token)?.secret ?? '';
    expect(secretMatches(secret, issued.secretHash)).toBe(true);
    const other = `${secret.slice(0, -1)}${secret.endsWith('A') ? 'B' : 'A'}`;
    expect(secretMatches(other, issued.secretHash)).toBe(false);
    expect(secretMatches(secret, 'ab')).toBe(false);
  });

  it('refuses tokens that are not exactly prefix, UUID, dot and 43 base64url characters', () => {
    const { token, id } = newWorkerToken();
    const secret = token.split('.')[1];
    for (const bad of [
      '',
      `${WORKER_TOKEN_PREFIX}${id}`,
      `${WORKER_TOKEN_PREFIX}${id}.${secret}=`,
      `${WORKER_TOKEN_PREFIX}${id}.${secret.slice(1)}`,
      `${WORKER_TOKEN_PREFIX}${id.toUpperCase()}.${secret}`,
      `gyre_xx_${id}.${secret}`,
      ` ${token}`,
    ]) {
      expect([bad, parseWorkerToken(bad)]).toEqual([bad, null]);
    }
  });

  it('finds a worker token in a Bearer header (scheme in any case, RFC 7235 §2.1), not a JWT', () => {
    const { token } = newWorkerToken();
    expect(workerTokenInHeader(`Bearer ${token}`)).toBe(token);
    expect(workerTokenInHeader(`bearer ${token}`)).toBe(token);
    expect(workerTokenInHeader('Bearer gyre_wt_broken')).toBe('gyre_wt_broken');
    expect(workerTokenInHeader('Bearer eyJhbGciOiJIUzI1NiJ9.e30.sig')).toBeNull();
    expect(workerTokenInHeader(`Basic ${token}`)).toBeNull();
    expect(workerTokenInHeader(undefined)).toBeNull();
  });
});
