import type { Request } from 'express';

/**
 * The client's address as Express resolves it: the socket's, or the forwarded one only when
 * the peer is a proxy named by TRUST_PROXY (`trust proxy`, set in app.factory.ts).
 */
export function clientAddressOf(request: Request): string | null {
  return request.ip ?? request.socket.remoteAddress ?? null;
}
