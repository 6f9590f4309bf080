import { Inject, Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { EntityManager, Repository } from 'typeorm';
import { MeResponse, packRulesFor, SessionResponse } from '@gyre/shared';
import { AuditService } from '../audit/audit.service';
import { WriteTransactions } from '../common/database/write-transactions.service';
import { ErrorKind, GyreException } from '../common/errors/gyre.exception';
import { isoAfter, nowIso } from '../common/time';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { clientLink, passwordResetMail } from '../mail/mail-templates';
import { OutboxService } from '../mail/outbox.service';
import { toSiteView } from '../sites/site-view';
import { SitesService } from '../sites/sites.service';
import { StudiesService } from '../studies/studies.service';
import { toStudyView } from '../studies/study-view';
import { User } from '../users/user.entity';
import { toUserView } from '../users/user-view';
import { ACCESS_TOKEN_LIFETIME_S, AccessTokens } from './access-tokens.service';
import { AuthError } from './auth.errors';
import { AuthUser } from './auth-user';
import { OneTimeTokens } from './one-time-tokens.service';
import { assertPasswordAcceptable } from './password-policy';
import { PasswordHasher } from './password-hasher.service';
import { RefreshTokens } from './refresh-tokens.service';

/** Five wrong passwords in a row lock the account for fifteen minutes. */
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
    @InjectRepository(User) private readonly users: Repository<User>,
    private readonly writes: WriteTransactions,
    private readonly hasher: PasswordHasher,
    private readonly accessTokens: AccessTokens,
    private readonly refreshTokens: RefreshTokens,
    private readonly oneTimeTokens: OneTimeTokens,
    private readonly audit: AuditService,
    private readonly outbox: OutboxService,
    private readonly studies: StudiesService,
    private readonly sites: SitesService,
  ) {}

  async signIn(
    emailInput: string,
    password: string,
    clientIp: string | null,
  ): Promise<IssuedSession> {
    const email = emailInput.trim().toLowerCase();
    const user = await this.users.findOneBy({ email });
    const failed = (reason: string, actor: User | null): Promise<unknown> =>
      this.audit.record({
        actor: actor ?? { id: null, email },
        action: 'sign-in-failed',
        objectType: 'Session',
        objectId: actor?.id ?? null,
        reason,
        clientIp,
      });
    if (user === null || user.state !== 'active' || user.passwordHash === null) {
      await this.hasher.verifyAgainstNothing(password);
      await failed(user === null ? 'unknown e-mail' : `account ${user.state}`, user);
      throw new GyreException(
        ErrorKind.Unauthenticated,
        AuthError.WrongCredentials,
        WRONG_CREDENTIALS,
      );
    }
    if (user.lockedUntil !== null && user.lockedUntil > nowIso()) {
      await failed('account locked', user);
      throw lockedError(user.lockedUntil);
    }
    if (!(await this.hasher.verify(password, user.passwordHash))) {
      const lockedUntil = await this.countFailure(user, clientIp);
      await failed('wrong password', user);
      if (lockedUntil !== null) throw lockedError(lockedUntil);
      throw new GyreException(
        ErrorKind.Unauthenticated,
        AuthError.WrongCredentials,
        WRONG_CREDENTIALS,
      );
    }
    return this.writes.run(async (manager) => {
      const at = nowIso();
      await manager.update(
        User,
        { id: user.id },
        { failedSignIns: 0, lockedUntil: null, lastSignInAt: at },
      );
      const refresh = await this.refreshTokens.issue(manager, user.id);
      await this.audit.record({
        actor: user,
        action: 'sign-in',
        objectType: 'Session',
        objectId: user.id,
        clientIp,
      });
      return { response: this.session({ ...user, lastSignInAt: at }), refresh };
    });
  }

  /** Counts one wrong password atomically; returns the lock's end if this one locked it. */
  private countFailure(user: User, clientIp: string | null): Promise<string | null> {
    return this.writes.run(async (manager) => {
      await manager.increment(User, { id: user.id }, 'failedSignIns', 1);
      const fresh = await manager.findOneByOrFail(User, { id: user.id });
      if (fresh.failedSignIns < MAX_FAILED_SIGN_INS) return null;
      const lockedUntil = isoAfter(LOCKOUT_MS);
      await manager.update(User, { id: user.id }, { failedSignIns: 0, lockedUntil });
      await this.audit.record({
        actor: null,
        action: 'account-locked',
        objectType: 'User',
        objectId: user.id,
        studyId: user.studyId,
        siteId: user.siteId,
        after: { lockedUntil },
        reason: `${MAX_FAILED_SIGN_INS} wrong passwords in a row`,
        clientIp,
      });
      return lockedUntil;
    });
  }

  async refresh(secret: string | null, clientIp: string | null): Promise<IssuedSession> {
    if (secret === null) {
      throw new GyreException(
        ErrorKind.Unauthenticated,
        AuthError.RefreshMissing,
        'No session cookie: sign in.',
      );
    }
    const outcome = await this.writes.run(async (manager) => {
      const rotation = await this.refreshTokens.rotate(manager, secret);
      const user = await manager.findOneBy(User, { id: rotation.userId });
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
        refresh: { secret: rotation.secret, expiresAt: rotation.expiresAt },
      };
    });
    // Thrown outside the transaction so that the revocation above is committed.
    if (outcome.kind === 'reused') {
      throw new GyreException(
        ErrorKind.Unauthenticated,
        AuthError.RefreshReused,
        'This session token was already used; all sessions of that sign-in are now ended. Sign in again.',
      );
    }
    if (outcome.kind === 'inactive') {
      throw new GyreException(
        ErrorKind.Unauthenticated,
        AuthError.RefreshInvalid,
        'The account is not active.',
      );
    }
    return { response: this.session(outcome.user), refresh: outcome.refresh };
  }

  async signOut(secret: string | null, clientIp: string | null): Promise<void> {
    if (secret === null) return;
    await this.writes.run(async (manager) => {
      const userId = await this.refreshTokens.revokeBySecret(manager, secret);
      if (userId === null) return;
      const user = await manager.findOneBy(User, { id: userId });
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
    const user = await this.users.findOneByOrFail({ id: authUser.id });
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
    const user = await this.users.findOneByOrFail({ id: authUser.id });
    if (
      user.passwordHash === null ||
      !(await this.hasher.verify(currentPassword, user.passwordHash))
    ) {
      throw new GyreException(
        ErrorKind.BadInput,
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
    const user = await this.users.findOneBy({ email });
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
      const user = await manager.findOneByOrFail(User, { id: userId });
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
      const user = await manager.findOneByOrFail(User, { id: userId });
      if (user.state !== 'invited') {
        throw new GyreException(
          ErrorKind.BadInput,
          AuthError.OneTimeTokenUsed,
          `token: this account is already ${user.state}`,
          { field: 'token' },
        );
      }
      assertPasswordAcceptable(password, { field: 'password', email: user.email });
      const passwordHash = await this.hasher.hash(password);
      const at = nowIso();
      const changes = {
        state: 'active' as const,
        name: name?.trim() ?? user.name,
        passwordHash,
        passwordChangedAt: at,
        updatedAt: at,
      };
      await manager.update(User, { id: user.id }, changes);
      await this.audit.record({
        actor: user,
        action: 'invitation-accepted',
        objectType: 'User',
        objectId: user.id,
        before: { state: user.state, name: user.name },
        after: { state: changes.state, name: changes.name },
        clientIp,
      });
    });
  }

  private async setPassword(
    manager: EntityManager,
    userId: string,
    passwordHash: string,
  ): Promise<void> {
    const at = nowIso();
    await manager.update(
      User,
      { id: userId },
      { passwordHash, passwordChangedAt: at, updatedAt: at, failedSignIns: 0, lockedUntil: null },
    );
    await this.refreshTokens.revokeAllOfUser(manager, userId, 'password-change');
  }

  private session(user: User): SessionResponse {
    return {
      accessToken: this.accessTokens.issue(user),
      tokenType: 'Bearer',
      expiresInS: ACCESS_TOKEN_LIFETIME_S,
      user: toUserView(user),
    };
  }
}

function lockedError(lockedUntil: string): GyreException {
  return new GyreException(
    ErrorKind.Locked,
    AuthError.AccountLocked,
    `Too many wrong passwords: the account is locked until ${lockedUntil}.`,
    { lockedUntil },
  );
}
