import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { EntityManager, IsNull } from 'typeorm';
import { isoAfter, nowIso } from '../common/time';
import { AuthError, authError } from './auth.errors';
import { OneTimeToken, OneTimeTokenPurpose } from './one-time-token.entity';
import { hashTokenSecret, newTokenSecret } from './token-secrets';

export const ONE_TIME_TOKEN_LIFETIME_MS: Record<OneTimeTokenPurpose, number> = {
  invitation: 7 * 24 * 3600 * 1000,
  password_reset: 3600 * 1000,
};

/** Invitation and password-reset tokens: e-mailed once, stored as hashes, usable once. */
@Injectable()
export class OneTimeTokensService {
  /** Issues a token; any earlier unused token of the same purpose for the user stops working. */
  async issue(
    manager: EntityManager,
    userId: string,
    purpose: OneTimeTokenPurpose,
  ): Promise<{ secret: string; expiresAt: string }> {
    await manager.update(OneTimeToken, { userId, purpose, usedAt: IsNull() }, { usedAt: nowIso() });
    const secret = newTokenSecret();
    const expiresAt = isoAfter(ONE_TIME_TOKEN_LIFETIME_MS[purpose]);
    await manager.insert(OneTimeToken, {
      id: randomUUID(),
      userId,
      purpose,
      tokenHash: hashTokenSecret(secret),
      createdAt: nowIso(),
      expiresAt,
      usedAt: null,
    });
    return { secret, expiresAt };
  }

  /** Marks the token used and returns its user; refuses unknown, expired and spent tokens. */
  async consume(
    manager: EntityManager,
    secret: string,
    purpose: OneTimeTokenPurpose,
  ): Promise<string> {
    const token = await manager.findOneBy(OneTimeToken, {
      tokenHash: hashTokenSecret(secret),
      purpose,
    });
    const what = purpose === 'invitation' ? 'invitation' : 'password-reset link';
    if (token === null) {
      throw authError(AuthError.OneTimeTokenInvalid, `token: this ${what} is not valid`, {
        field: 'token',
      });
    }
    if (token.usedAt !== null) {
      throw authError(
        AuthError.OneTimeTokenUsed,
        `token: this ${what} was already used or replaced by a newer one`,
        { field: 'token' },
      );
    }
    if (token.expiresAt <= nowIso()) {
      throw authError(
        AuthError.OneTimeTokenExpired,
        `token: this ${what} expired at ${token.expiresAt}`,
        { field: 'token', expiresAt: token.expiresAt },
      );
    }
    const { affected } = await manager.update(
      OneTimeToken,
      { id: token.id, usedAt: IsNull() },
      { usedAt: nowIso() },
    );
    if (affected !== 1) {
      throw authError(AuthError.OneTimeTokenUsed, `token: this ${what} was already used`, {
        field: 'token',
      });
    }
    return token.userId;
  }
}
