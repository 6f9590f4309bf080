import type { Request } from 'express';

/** The client's address as Express resolves it (`trust proxy` is set to loopback only). */
export function clientAddressOf(request: Request): string | null {
  return request.ip ?? request.socket.remoteAddress ?? null;
}
