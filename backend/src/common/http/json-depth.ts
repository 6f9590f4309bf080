import type { NextFunction, Request, Response } from 'express';
import { HttpEdgeError, httpEdgeError } from './http-edge.errors';

/** Deepest array/object nesting a body may have: Gyre's own need 3; 5 000 overflowed validation. */
export const MAX_BODY_DEPTH = 32;

/** Whether `value` nests arrays/objects more than `limit` levels deep; walks without recursion. */
export function nestsDeeperThan(value: unknown, limit: number): boolean {
  const pending: Array<[unknown, number]> = [[value, 1]];
  while (pending.length > 0) {
    const [current, depth] = pending.pop() as [unknown, number];
    if (typeof current !== 'object' || current === null) continue;
    if (depth > limit) return true;
    for (const child of Object.values(current)) {
      if (typeof child === 'object' && child !== null) pending.push([child, depth + 1]);
    }
  }
  return false;
}

/** Express middleware after the body parsers: refuses a parsed body nested too deep (400). */
export function rejectDeepBodies(request: Request, _response: Response, next: NextFunction): void {
  if (!nestsDeeperThan(request.body, MAX_BODY_DEPTH)) {
    next();
    return;
  }
  next(
    httpEdgeError(
      HttpEdgeError.BodyTooDeep,
      `request body: arrays/objects nested more than ${MAX_BODY_DEPTH} levels deep found, at most ${MAX_BODY_DEPTH} levels expected`,
      { field: 'body', maxDepth: MAX_BODY_DEPTH },
    ),
  );
}
