import { ExecutionContext, Injectable } from '@nestjs/common';
import { ThrottlerGuard, type ThrottlerLimitDetail } from '@nestjs/throttler';
import type { Response } from 'express';
import { AuthError, authError } from './auth.errors';

/**
 * The per-address limit on `/api/auth/*`, answering like every other Gyre error: 429 with a
 * standard `Retry-After` in seconds (RFC 9110 §10.2.3) and `{ statusCode, code, message,
 * details }`, instead of the library's `Retry-After-auth` header and "ThrottlerException".
 */
@Injectable()
export class AuthThrottlerGuard extends ThrottlerGuard {
  protected override throwThrottlingException(
    context: ExecutionContext,
    detail: ThrottlerLimitDetail,
  ): Promise<void> {
    const retryAfterS = Math.max(1, Math.ceil(detail.timeToBlockExpire));
    context.switchToHttp().getResponse<Response>().setHeader('Retry-After', String(retryAfterS));
    throw authError(
      AuthError.TooManyRequests,
      `Too many requests from this address: wait ${retryAfterS} s before trying again.`,
      { retryAfterS },
    );
  }
}
