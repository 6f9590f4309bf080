import { randomUUID } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { EntityManager, IsNull } from 'typeorm';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { isoAfter, nowIso } from '../common/time';
import { AuthError } from './auth.errors';
import { RefreshToken } from './refresh-token.entity';
import { hashTokenSecret, newTokenSecret } from './token-secrets';

/** Seven days: a week without activity means signing in again. */
export const REFRESH_TOKEN_LIFETIME_MS = 7 * 24 * 3600 * 1000;

export type RotationOutcome =
  | { kind: 'rotated'; userId: string; secret: string; expiresAt: string }
  | { kind: 'reused'; userId: string; familyId: string };

/**
 * Refresh tokens rotate on every use. A token presented a second time means it was copied:
 * the whole family (every token descended from that sign-in) is revoked.
 * All methods take the manager of a `WriteTransactions.run` so that check and update are one.
 */
@Injectable()
export class RefreshTokens {
  async issue(
    manager: EntityManager,
    userId: string,
    familyId: string = randomUUID(),
  ): Promise<{ secret: string; expiresAt: string }> {
    const secret = newTokenSecret();
    const expiresAt = isoAfter(REFRESH_TOKEN_LIFETIME_MS);
    await manager.insert(RefreshToken, {
      id: randomUUID(),
      userId,
      familyId,
      tokenHash: hashTokenSecret(secret),
      createdAt: nowIso(),
      expiresAt,
      usedAt: null,
      revokedAt: null,
      revokedReason: null,
    });
    return { secret, expiresAt };
  }

  async rotate(manager: EntityManager, secret: string): Promise<RotationOutcome> {
    const token = await manager.findOneBy(RefreshToken, { tokenHash: hashTokenSecret(secret) });
    const invalid = (): never => {
      throw new GyreException(
        ErrorKind.Unauthenticated,
        AuthError.RefreshInvalid,
        'The session has ended or was revoked: sign in again.',
      );
    };
    if (token === null) return invalid();
    if (token.usedAt !== null) {
      await this.revokeFamily(manager, token.familyId, 'reuse');
      return { kind: 'reused', userId: token.userId, familyId: token.familyId };
    }
    if (token.revokedAt !== null || token.expiresAt <= nowIso()) return invalid();
    await manager.update(RefreshToken, { id: token.id }, { usedAt: nowIso() });
    const next = await this.issue(manager, token.userId, token.familyId);
    return { kind: 'rotated', userId: token.userId, ...next };
  }

  /** Sign-out: the family of the presented token (used or not). Returns its user, if known. */
  async revokeBySecret(manager: EntityManager, secret: string): Promise<string | null> {
    const token = await manager.findOneBy(RefreshToken, { tokenHash: hashTokenSecret(secret) });
    if (token === null) return null;
    await this.revokeFamily(manager, token.familyId, 'sign-out');
    return token.userId;
  }

  async revokeFamily(manager: EntityManager, familyId: string, reason: string): Promise<void> {
    await manager.update(
      RefreshToken,
      { familyId, revokedAt: IsNull() },
      { revokedAt: nowIso(), revokedReason: reason },
    );
  }

  /** Password change or reset, deactivation: every session of the user ends. */
  async revokeAllOfUser(manager: EntityManager, userId: string, reason: string): Promise<void> {
    await manager.update(
      RefreshToken,
      { userId, revokedAt: IsNull() },
      { revokedAt: nowIso(), revokedReason: reason },
    );
  }
}
