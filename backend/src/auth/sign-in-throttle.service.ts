import { createHash } from 'node:crypto';
import { Injectable } from '@nestjs/common';
import { DEFAULT_IPV6_SUBNET_PREFIX, normalizeIp } from '@nestjs/throttler';
import { EntityManager, LessThan } from 'typeorm';
import { SignInThrottle, SignInThrottleScope } from './sign-in-throttle.entity';

export interface ThrottlePolicy {
  /** Failures that cost nothing; each further one doubles the wait before the next attempt. */
  freeFailures: number;
  baseDelayMs: number;
  maxDelayMs: number;
}

/**
 * Anti-automation without a lock a stranger can set (OWASP ASVS 4.0 2.2.1): growing delays
 * per account from one address (targeted guessing), per address (spraying many accounts) and
 * per account across addresses (distributed guessing). The last is capped at a short delay
 * and each address adds at most `ACCOUNT_SHARE_PER_ADDRESS` failures to it, so failures from
 * one address never slow the owner signing in from another.
 */
export const SIGN_IN_THROTTLE_POLICIES: Record<SignInThrottleScope, ThrottlePolicy> = {
  pair: { freeFailures: 5, baseDelayMs: 1000, maxDelayMs: 15 * 60_000 },
  address: { freeFailures: 20, baseDelayMs: 1000, maxDelayMs: 5 * 60_000 },
  account: { freeFailures: 10, baseDelayMs: 1000, maxDelayMs: 30_000 },
};
export const ACCOUNT_SHARE_PER_ADDRESS = 3;
/** Failures are forgotten after an hour without a new one (longer than any delay). */
export const SIGN_IN_FAILURE_MEMORY_MS = 60 * 60_000;

export function delayAfter(failures: number, policy: ThrottlePolicy): number {
  const over = failures - policy.freeFailures;
  if (over <= 0) return 0;
  return Math.min(policy.maxDelayMs, policy.baseDelayMs * 2 ** Math.min(over - 1, 30));
}

interface CountedFailure {
  scope: SignInThrottleScope;
  failures: number;
  blockedUntil: string;
  /** The row before this attempt was counted (null: there was none). */
  before: Pick<SignInThrottle, 'failures' | 'lastFailureAt' | 'blockedUntil'> | null;
}

/** What a reservation counted, so that a success can take it back. */
export interface SignInReservation {
  kind: 'reserved';
  keys: Record<SignInThrottleScope, string>;
  counted: CountedFailure[];
}

export type SignInAdmission = SignInReservation | { kind: 'refused'; retryAfterMs: number };

/**
 * Every attempt is counted as a failure before the password is checked (in one write
 * transaction with the check), so that parallel guesses cannot slip through one open window;
 * a success then takes the count back. Keys are the e-mail as typed (normalised), never the
 * user id, so known and unknown accounts are throttled alike.
 */
@Injectable()
export class SignInThrottlesService {
  async admit(
    manager: EntityManager,
    email: string,
    clientIp: string | null,
  ): Promise<SignInAdmission> {
    const now = Date.now();
    const at = new Date(now).toISOString();
    await manager.delete(SignInThrottle, {
      lastFailureAt: LessThan(new Date(now - SIGN_IN_FAILURE_MEMORY_MS).toISOString()),
    });
    // An IPv6 client commonly holds a whole /64: counted as one address, as the route limit does.
    const address =
      clientIp === null ? 'unknown' : normalizeIp(clientIp, DEFAULT_IPV6_SUBNET_PREFIX);
    const keys: Record<SignInThrottleScope, string> = {
      pair: keyOf('pair', `${email}\n${address}`),
      address: keyOf('address', address),
      account: keyOf('account', email),
    };
    const rows = new Map<SignInThrottleScope, SignInThrottle>();
    for (const scope of ['pair', 'address', 'account'] as const) {
      const row = await manager.findOneBy(SignInThrottle, { key: keys[scope] });
      if (row !== null) rows.set(scope, row);
    }
    const waits = [...rows.values()].map((row) => Date.parse(row.blockedUntil) - now);
    const retryAfterMs = Math.max(0, ...waits);
    if (retryAfterMs > 0) return { kind: 'refused', retryAfterMs };

    const pairFailures = (rows.get('pair')?.failures ?? 0) + 1;
    const scopes: SignInThrottleScope[] = ['pair', 'address'];
    if (pairFailures <= ACCOUNT_SHARE_PER_ADDRESS) scopes.push('account');
    const counted: CountedFailure[] = [];
    for (const scope of scopes) {
      const row = rows.get(scope);
      const failures = (row?.failures ?? 0) + 1;
      const blockedUntil = new Date(
        now + delayAfter(failures, SIGN_IN_THROTTLE_POLICIES[scope]),
      ).toISOString();
      await manager.save(SignInThrottle, {
        key: keys[scope],
        scope,
        failures,
        lastFailureAt: at,
        blockedUntil,
      });
      const before =
        row === undefined
          ? null
          : {
              failures: row.failures,
              lastFailureAt: row.lastFailureAt,
              blockedUntil: row.blockedUntil,
            };
      counted.push({ scope, failures, blockedUntil, before });
    }
    return { kind: 'reserved', keys, counted };
  }

  /**
   * The password was right: the count of this account from this address starts again; the
   * address's and the account's counts only lose this attempt, so that the owner signing in
   * does not wipe what a spraying or distributed attacker has run up.
   */
  async succeeded(manager: EntityManager, reservation: SignInReservation): Promise<void> {
    await manager.delete(SignInThrottle, { key: reservation.keys.pair });
    for (const mine of reservation.counted) {
      if (mine.scope === 'pair') continue;
      // Only when nobody counted another failure in between; otherwise theirs stands.
      const where = { key: reservation.keys[mine.scope], blockedUntil: mine.blockedUntil };
      if (mine.before === null) await manager.delete(SignInThrottle, where);
      else await manager.update(SignInThrottle, where, mine.before);
    }
  }
}

/** Scopes whose delay starts with this failure (for the audit trail). */
export function newlyThrottled(reservation: SignInReservation): CountedFailure[] {
  return reservation.counted.filter(
    (c) => c.failures === SIGN_IN_THROTTLE_POLICIES[c.scope].freeFailures + 1,
  );
}

function keyOf(scope: SignInThrottleScope, value: string): string {
  return createHash('sha256').update(`${scope}\n${value}`, 'utf8').digest('hex');
}

/** Whole seconds to wait, never 0 (RFC 9110 §10.2.3 `Retry-After: delay-seconds`). */
export function retryAfterSeconds(ms: number): number {
  return Math.max(1, Math.ceil(ms / 1000));
}
