import type { NextFunction, Request, Response } from 'express';

/** API answers hold study or personal data: no cache may keep them (RFC 9111 §5.2.2.5). */
export function noStore(_request: Request, response: Response, next: NextFunction): void {
  // Set first, so a route that sets its own Cache-Control (SSE, refresh) still wins.
  response.setHeader('Cache-Control', 'no-store');
  next();
}
