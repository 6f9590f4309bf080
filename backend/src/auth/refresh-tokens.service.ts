import { randomUUID } from 'node:crypto';
import { Inject, Injectable, Optional } from '@nestjs/common';
import { EntityManager, IsNull } from 'typeorm';
import { SqliteReadsService } from '../common/database/sqlite-reads.service';
import { isoAfter, nowIso } from '../common/time';
import { AuthError, authError } from './auth.errors';
import { RefreshToken } from './refresh-token.entity';
import { hashTokenSecret, newTokenSecret, openSuccessor, sealSuccessor } from './token-secrets';

/** Seven days: a week without activity means signing in again. */
export const REFRESH_TOKEN_LIFETIME_MS = 7 * 24 * 3600 * 1000;

/**
 * Ten seconds after a rotation, the spent token still yields the same successor: two tabs
 * refreshing with one cookie are a race, not theft. Later uses revoke the family.
 */
export const REFRESH_REUSE_GRACE_MS = 10_000;
/** Injection token for the grace period (AuthModule provides `REFRESH_REUSE_GRACE_MS`). */
export const REFRESH_REUSE_GRACE = Symbol('REFRESH_REUSE_GRACE');

/** How far a use within the grace follows successors that were themselves already rotated. */
const MAX_SUCCESSOR_STEPS = 4;

export interface IssuedRefreshToken {
  secret: string;
  expiresAt: string;
  /** The session: every token rotated from one sign-in, and the access tokens issued to it. */
  familyId: string;
}

export type RotationOutcome =
  | ({ kind: 'rotated'; userId: string } & IssuedRefreshToken)
  | { kind: 'reused'; userId: string; familyId: string };

/**
 * Refresh tokens rotate on every use. A token presented again after the grace period means
 * it was copied: the whole family (every token descended from that sign-in) is revoked.
 * All methods take the manager of a `WriteTransactionsService.run` so that check and update are one.
 */
@Injectable()
export class RefreshTokensService {
  constructor(
    private readonly reads: SqliteReadsService,
    @Optional()
    @Inject(REFRESH_REUSE_GRACE)
    private readonly reuseGraceMs: number = REFRESH_REUSE_GRACE_MS,
  ) {}

  async issue(
    manager: EntityManager,
    userId: string,
    familyId: string = randomUUID(),
  ): Promise<IssuedRefreshToken> {
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
      successorSealed: null,
    });
    return { secret, expiresAt, familyId };
  }

  async rotate(manager: EntityManager, secret: string): Promise<RotationOutcome> {
    const token = await this.bySecret(manager, secret);
    if (token === null) return invalid();
    if (token.usedAt !== null) {
      if (Date.now() - Date.parse(token.usedAt) <= this.reuseGraceMs) {
        // A family ended meanwhile (sign-out, password change) gives no successor, and is no theft.
        const head = await this.headAfter(manager, token, secret);
        return head === null ? invalid() : { kind: 'rotated', userId: token.userId, ...head };
      }
      await this.revokeFamily(manager, token.familyId, 'reuse');
      return { kind: 'reused', userId: token.userId, familyId: token.familyId };
    }
    if (token.revokedAt !== null || token.expiresAt <= nowIso()) return invalid();
    const next = await this.issue(manager, token.userId, token.familyId);
    await manager.update(
      RefreshToken,
      { id: token.id },
      { usedAt: nowIso(), successorSealed: sealSuccessor(secret, next.secret) },
    );
    return { kind: 'rotated', userId: token.userId, ...next };
  }

  /**
   * Whether the session (refresh family) an access token names is still open: read live on
   * every request (a prepared statement), so that ending a session refuses its access tokens
   * at the next request, whoever ended it (this service, or the lock trigger in SQLite).
   */
  isLive(userId: string, familyId: string): boolean {
    return (
      this.reads.one<{ live: number }>(
        `SELECT 1 AS "live" FROM "refresh_token" WHERE "familyId" = ? AND "userId" = ? AND "revokedAt" IS NULL LIMIT 1`,
        [familyId, userId],
      ) !== null
    );
  }

  /** Sign-out: the family of the presented token (used or not). Returns its user, if known. */
  async revokeBySecret(manager: EntityManager, secret: string): Promise<string | null> {
    const token = await this.bySecret(manager, secret);
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

  /** Password change or reset, deactivation, role change: every session of the user ends. */
  async revokeAllOfUser(manager: EntityManager, userId: string, reason: string): Promise<void> {
    await manager.update(
      RefreshToken,
      { userId, revokedAt: IsNull() },
      { revokedAt: nowIso(), revokedReason: reason },
    );
  }

  private bySecret(manager: EntityManager, secret: string): Promise<RefreshToken | null> {
    return manager.findOneBy(RefreshToken, { tokenHash: hashTokenSecret(secret) });
  }

  /** The family's current, unspent token reached from a spent one, or null if it ended. */
  private async headAfter(
    manager: EntityManager,
    spent: RefreshToken,
    spentSecret: string,
  ): Promise<IssuedRefreshToken | null> {
    let current = spent;
    let currentSecret = spentSecret;
    for (let step = 0; step < MAX_SUCCESSOR_STEPS; step += 1) {
      if (current.successorSealed === null) return null;
      const nextSecret = openSuccessor(currentSecret, current.successorSealed);
      if (nextSecret === null) return null;
      const next = await this.bySecret(manager, nextSecret);
      if (next === null || next.revokedAt !== null || next.expiresAt <= nowIso()) return null;
      if (next.usedAt === null) {
        return { secret: nextSecret, expiresAt: next.expiresAt, familyId: next.familyId };
      }
      current = next;
      currentSecret = nextSecret;
    }
    return null;
  }
}

function invalid(): never {
  throw authError(AuthError.RefreshInvalid, 'The session has ended or was revoked: sign in again.');
}
