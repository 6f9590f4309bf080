import { createHmac } from 'node:crypto';

/**
 * Builds JWTs by hand (RFC 7519 / RFC 7515 compact form) so that tests can present tokens the
 * server must refuse, independently of the signing library the server uses.
 */
export function forgeJwt(options: {
  header: Record<string, unknown>;
  payload: Record<string, unknown>;
  /** HMAC-SHA256 key; omit for an unsigned token (empty signature). */
  secret?: string;
}): string {
  const encode = (part: Record<string, unknown>): string =>
    Buffer.from(JSON.stringify(part)).toString('base64url');
  const signingInput = `${encode(options.header)}.${encode(options.payload)}`;
  const signature =
    options.secret === undefined
      ? ''
      : createHmac('sha256', options.secret).update(signingInput).digest('base64url');
  return `${signingInput}.${signature}`;
}

export function accessPayload(userId: string, lifetimeS = 900): Record<string, unknown> {
  const now = Math.floor(Date.now() / 1000);
  return {
    sub: userId,
    typ: 'access',
    role: 'analyst',
    iat: now,
    exp: now + lifetimeS,
    iss: 'gyre',
    aud: 'gyre-api',
  };
}
