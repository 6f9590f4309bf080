import { Inject, Injectable } from '@nestjs/common';
import { EntityManager } from 'typeorm';
import { MeResponse, packRulesFor, SessionResponse } from '@gyre/shared';
import { AccountsService } from '../accounts/accounts.service';
import type { User } from '../accounts/user.entity';
import { AuditService } from '../audit/audit.service';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { GyreException } from '../common/errors/gyre.exception';
import { nowIso } from '../common/time';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { clientLink, passwordResetMail } from '../mail/mail-templates';
import { OutboxService } from '../mail/outbox.service';
import { toSiteView } from '../sites/site-view';
import { SitesService } from '../sites/sites.service';
import { StudiesService } from '../studies/studies.service';
import { toStudyView } from '../studies/study-view';
import { toUserView } from '../users/user-view';
import { ACCESS_TOKEN_LIFETIME_S, AccessTokensService } from './access-tokens.service';
import { AuthError, authError } from './auth.errors';
import { AuthUser } from './auth-user';
import { OneTimeTokensService } from './one-time-tokens.service';
import { assertPasswordAcceptable } from './password-policy';
import { PasswordHasherService } from './password-hasher.service';
import { RefreshTokensService } from './refresh-tokens.service';
import type { SignInThrottleScope } from './sign-in-throttle.entity';
import {
  newlyThrottled,
  retryAfterSeconds,
  SIGN_IN_THROTTLE_POLICIES,
  SignInReservation,
  SignInThrottlesService,
} from './sign-in-throttle.service';

/**
 * Signing a report with five wrong passwords in a row locks the account for fifteen minutes
 * (`signoff/signer-verification.ts`; the lock ends every session, see the migration
 * `1764700100000-session-revocation.ts`). Sign-in itself never locks: it throttles.
 */
export const MAX_FAILED_SIGN_INS = 5;
export const LOCKOUT_MS = 15 * 60 * 1000;

export interface IssuedSession {
  response: SessionResponse;
  refresh: { secret: string; expiresAt: string };
}

const WRONG_CREDENTIALS = 'E-mail or password is wrong.';

@Injectable()
export class AuthService {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly accounts: AccountsService,
    private readonly writes: WriteTransactionsService,
    private readonly hasher: PasswordHasherService,
    private readonly accessTokens: AccessTokensService,
    private readonly refreshTokens: RefreshTokensService,
    private readonly oneTimeTokens: OneTimeTokensService,
    private readonly throttles: SignInThrottlesService,
    private readonly audit: AuditService,
    private readonly outbox: OutboxService,
    private readonly studies: StudiesService,
    private readonly sites: SitesService,
  ) {}

  /**
   * Known and unknown accounts take the same path: the same throttle, one bcrypt comparison
   * (against a dummy hash when there is no usable account) and the same answer.
   */
  async signIn(
    emailInput: string,
    password: string,
    clientIp: string | null,
  ): Promise<IssuedSession> {
    const email = emailInput.trim().toLowerCase();
    const admission = await this.writes.run((manager) =>
      this.throttles.admit(manager, email, clientIp),
    );
    if (admission.kind === 'refused') throw throttledError(admission.retryAfterMs);
    const user = await this.accounts.byEmail(email);
    const usable =
      user !== null && user.state === 'active' && user.passwordHash !== null ? user : null;
    const passwordRight =
      usable === null || usable.passwordHash === null
        ? await this.hasher.verifyAgainstNothing(password)
        : await this.hasher.verify(password, usable.passwordHash);
    if (usable === null || !passwordRight) {
      await this.writes.run(async () => {
        await this.audit.record({
          actor: user ?? { id: null, email },
          action: 'sign-in-failed',
          objectType: 'Session',
          objectId: user?.id ?? null,
          reason:
            user === null
              ? 'unknown e-mail'
              : usable === null
                ? `account ${user.state}`
                : 'wrong password',
          clientIp,
        });
        await this.recordThrottling(admission, email, user, clientIp);
      });
      throw authError(AuthError.WrongCredentials, WRONG_CREDENTIALS);
    }
    if (usable.lockedUntil !== null && usable.lockedUntil > nowIso()) {
      // Only someone who knows the password learns of the lock.
      const lockedUntil = usable.lockedUntil;
      await this.writes.run(async (manager) => {
        await this.throttles.succeeded(manager, admission);
        await this.audit.record({
          actor: usable,
          action: 'sign-in-failed',
          objectType: 'Session',
          objectId: usable.id,
          reason: 'account locked',
          clientIp,
        });
      });
      throw lockedError(lockedUntil);
    }
    return this.writes.run(async (manager) => {
      await this.throttles.succeeded(manager, admission);
      const at = nowIso();
      await this.accounts.recordSignIn(usable.id, at, manager);
      const refresh = await this.refreshTokens.issue(manager, usable.id);
      await this.audit.record({
        actor: usable,
        action: 'sign-in',
        objectType: 'Session',
        objectId: usable.id,
        clientIp,
      });
      return {
        response: this.session({ ...usable, lastSignInAt: at }, refresh.familyId),
        refresh,
      };
    });
  }

  /** One entry when a delay starts for a scope (not one per refused attempt). */
  private async recordThrottling(
    admission: SignInReservation,
    email: string,
    user: User | null,
    clientIp: string | null,
  ): Promise<void> {
    for (const started of newlyThrottled(admission)) {
      const policy = SIGN_IN_THROTTLE_POLICIES[started.scope];
      const about = started.scope === 'address' ? null : user;
      await this.audit.record({
        actor: null,
        action: 'sign-in-throttled',
        objectType: started.scope === 'address' ? 'Session' : 'User',
        objectId: about?.id ?? null,
        studyId: about?.studyId ?? null,
        siteId: about?.siteId ?? null,
        after: {
          scope: started.scope,
          email: started.scope === 'address' ? null : email,
          failures: started.failures,
          nextAttemptAt: started.blockedUntil,
        },
        reason: `${THROTTLE_REASON[started.scope]}; further attempts wait, the wait doubling up to ${policy.maxDelayMs / 1000} s`,
        clientIp,
      });
    }
  }

  async refresh(secret: string | null, clientIp: string | null): Promise<IssuedSession> {
    if (secret === null) {
      throw authError(AuthError.RefreshMissing, 'No session cookie: sign in.');
    }
    const outcome = await this.writes.run(async (manager) => {
      const rotation = await this.refreshTokens.rotate(manager, secret);
      const user = await this.accounts.findById(rotation.userId, manager);
      if (rotation.kind === 'reused') {
        await this.audit.record({
          actor: user ?? { id: rotation.userId, email: null },
          action: 'refresh-reuse',
          objectType: 'Session',
          objectId: rotation.userId,
          reason:
            'a spent refresh token was presented again; every session of that sign-in was revoked',
          clientIp,
        });
        return { kind: 'reused' as const };
      }
      if (user === null || user.state !== 'active') {
        await this.refreshTokens.revokeAllOfUser(manager, rotation.userId, 'inactive');
        return { kind: 'inactive' as const };
      }
      return {
        kind: 'ok' as const,
        user,
        familyId: rotation.familyId,
        refresh: { secret: rotation.secret, expiresAt: rotation.expiresAt },
      };
    });
    // Thrown outside the transaction so that the revocation above is committed.
    if (outcome.kind === 'reused') {
      throw authError(
        AuthError.RefreshReused,
        'This session token was already used; all sessions of that sign-in are now ended. Sign in again.',
      );
    }
    if (outcome.kind === 'inactive') {
      throw authError(AuthError.RefreshInvalid, 'The account is not active.');
    }
    return {
      response: this.session(outcome.user, outcome.familyId),
      refresh: outcome.refresh,
    };
  }

  async signOut(secret: string | null, clientIp: string | null): Promise<void> {
    if (secret === null) return;
    await this.writes.run(async (manager) => {
      const userId = await this.refreshTokens.revokeBySecret(manager, secret);
      if (userId === null) return;
      const user = await this.accounts.findById(userId, manager);
      await this.audit.record({
        actor: user ?? { id: userId, email: null },
        action: 'sign-out',
        objectType: 'Session',
        objectId: userId,
        clientIp,
      });
    });
  }

  async me(authUser: AuthUser): Promise<MeResponse> {
    const user = await this.accounts.byId(authUser.id);
    const study = user.studyId === null ? null : await this.studies.findById(user.studyId);
    const site = user.siteId === null ? null : await this.sites.findById(user.siteId);
    return {
      user: toUserView(user),
      study: study === null ? null : toStudyView(study),
      site: site === null ? null : toSiteView(site),
      rules: packRulesFor(authUser),
    };
  }

  async changePassword(
    authUser: AuthUser,
    currentPassword: string,
    newPassword: string,
    clientIp: string | null,
  ): Promise<void> {
    const user = await this.accounts.byId(authUser.id);
    if (
      user.passwordHash === null ||
      !(await this.hasher.verify(currentPassword, user.passwordHash))
    ) {
      throw authError(
        AuthError.CurrentPasswordWrong,
        'currentPassword: does not match your password',
        { field: 'currentPassword' },
      );
    }
    assertPasswordAcceptable(newPassword, { field: 'newPassword', email: user.email });
    const passwordHash = await this.hasher.hash(newPassword);
    await this.writes.run(async (manager) => {
      await this.setPassword(manager, user.id, passwordHash);
      await this.audit.record({
        actor: authUser,
        action: 'password-change',
        objectType: 'User',
        objectId: user.id,
        reason: 'changed by the user; every session ended',
        clientIp,
      });
    });
  }

  /** Always answers the same, whether or not the address belongs to an account. */
  async requestPasswordReset(emailInput: string, clientIp: string | null): Promise<void> {
    const email = emailInput.trim().toLowerCase();
    const user = await this.accounts.byEmail(email);
    if (user === null || user.state !== 'active') {
      await this.audit.record({
        actor: { id: null, email },
        action: 'password-reset-request',
        objectType: 'User',
        objectId: null,
        studyId: null,
        siteId: null,
        reason:
          user === null
            ? 'no account with this e-mail; nothing sent'
            : `account ${user.state}; nothing sent`,
        clientIp,
      });
      return;
    }
    await this.writes.run(async (manager) => {
      const { secret, expiresAt } = await this.oneTimeTokens.issue(
        manager,
        user.id,
        'password_reset',
      );
      const link = clientLink(this.config.publicUrl, '/reset-password', secret);
      await this.outbox.enqueue(
        manager,
        user.email,
        passwordResetMail({ name: user.name, link, expiresAt }),
      );
      await this.audit.record({
        actor: { id: null, email },
        action: 'password-reset-request',
        objectType: 'User',
        objectId: user.id,
        studyId: user.studyId,
        siteId: user.siteId,
        reason: 'reset link e-mailed',
        clientIp,
      });
    });
    this.outbox.kick();
  }

  async confirmPasswordReset(
    token: string,
    newPassword: string,
    clientIp: string | null,
  ): Promise<void> {
    await this.writes.run(async (manager) => {
      const userId = await this.oneTimeTokens.consume(manager, token, 'password_reset');
      const user = await this.accounts.byId(userId, manager);
      assertPasswordAcceptable(newPassword, { field: 'newPassword', email: user.email });
      await this.setPassword(manager, user.id, await this.hasher.hash(newPassword));
      await this.audit.record({
        actor: user,
        action: 'password-reset',
        objectType: 'User',
        objectId: user.id,
        reason: 'reset through the e-mailed link; every session ended, lock lifted',
        clientIp,
      });
    });
  }

  async acceptInvitation(
    token: string,
    password: string,
    name: string | undefined,
    clientIp: string | null,
  ): Promise<void> {
    await this.writes.run(async (manager) => {
      const userId = await this.oneTimeTokens.consume(manager, token, 'invitation');
      const user = await this.accounts.byId(userId, manager);
      if (user.state !== 'invited') {
        throw authError(
          AuthError.OneTimeTokenUsed,
          `token: this account is already ${user.state}`,
          { field: 'token' },
        );
      }
      assertPasswordAcceptable(password, { field: 'password', email: user.email });
      const passwordHash = await this.hasher.hash(password);
      const activatedName = name?.trim() ?? user.name;
      await this.accounts.activateInvited(
        user.id,
        { name: activatedName, passwordHash, at: nowIso() },
        manager,
      );
      await this.audit.record({
        actor: user,
        action: 'invitation-accepted',
        objectType: 'User',
        objectId: user.id,
        before: { state: user.state, name: user.name },
        after: { state: 'active', name: activatedName },
        clientIp,
      });
    });
  }

  private async setPassword(
    manager: EntityManager,
    userId: string,
    passwordHash: string,
  ): Promise<void> {
    await this.accounts.setPasswordHash(userId, passwordHash, nowIso(), manager);
    await this.refreshTokens.revokeAllOfUser(manager, userId, 'password-change');
  }

  private session(user: User, familyId: string): SessionResponse {
    return {
      accessToken: this.accessTokens.issue(user, familyId),
      tokenType: 'Bearer',
      expiresInS: ACCESS_TOKEN_LIFETIME_S,
      user: toUserView(user),
    };
  }
}

const THROTTLE_REASON: Record<SignInThrottleScope, string> = {
  pair: 'repeated failed sign-ins to this account from this address',
  address: 'repeated failed sign-ins from this address',
  account: 'repeated failed sign-ins to this account from several addresses',
};

function throttledError(retryAfterMs: number): GyreException {
  const retryAfterS = retryAfterSeconds(retryAfterMs);
  return authError(
    AuthError.SignInThrottled,
    `Too many failed sign-ins: wait ${retryAfterS} s before trying again.`,
    { retryAfterS },
  );
}

function lockedError(lockedUntil: string): GyreException {
  return authError(
    AuthError.AccountLocked,
    `Too many wrong passwords: the account is locked until ${lockedUntil}.`,
    { lockedUntil },
  );
}
