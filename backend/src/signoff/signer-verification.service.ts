import { Injectable } from '@nestjs/common';
import { AccountsService } from '../accounts/accounts.service';
import type { User } from '../accounts/user.entity';
import { AuditService } from '../audit/audit.service';
import { LOCKOUT_MS, MAX_FAILED_SIGN_INS } from '../auth/auth.service';
import type { Caller } from '../auth/decorators';
import { PasswordHasherService } from '../auth/password-hasher.service';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { GyreException } from '../common/errors/gyre.exception';
import { isoAfter, nowIso } from '../common/time';
import { SignoffError, signoffError } from './signoff.errors';

/**
 * The signer proves again who they are: their password, entered at signing (21 CFR Part 11
 * §11.200(a)(1): a signature outside one continuous session uses all its components). Wrong
 * passwords count toward the same lockout as sign-in (five, then fifteen minutes).
 */
@Injectable()
export class SignerVerificationService {
  constructor(
    private readonly writes: WriteTransactionsService,
    private readonly hasher: PasswordHasherService,
    private readonly audit: AuditService,
    private readonly accounts: AccountsService,
  ) {}

  async verify(caller: Caller, password: string, reportId: string): Promise<User> {
    const user = await this.writes.run((manager) =>
      this.accounts.findById(caller.user.id, manager),
    );
    if (user === null || user.state !== 'active' || user.passwordHash === null) {
      throw wrongPassword();
    }
    if (user.lockedUntil !== null && user.lockedUntil > nowIso()) throw locked(user.lockedUntil);
    if (await this.hasher.verify(password, user.passwordHash)) {
      if (user.failedSignIns > 0) {
        await this.writes.run((m) => this.accounts.clearFailedSignIns(user.id, m));
      }
      return user;
    }
    const lockedUntil = await this.writes.run(async (manager) => {
      const failedSignIns = await this.accounts.addFailedSignIn(user.id, manager);
      await this.audit.record({
        actor: caller.user,
        action: 'sign-refused',
        objectType: 'Report',
        objectId: reportId,
        reason: 'wrong password at signing',
        clientIp: caller.clientIp,
      });
      if (failedSignIns < MAX_FAILED_SIGN_INS) return null;
      const until = isoAfter(LOCKOUT_MS);
      await this.accounts.lockUntil(user.id, until, manager);
      await this.audit.record({
        actor: null,
        action: 'account-locked',
        objectType: 'User',
        objectId: user.id,
        studyId: user.studyId,
        siteId: user.siteId,
        after: { lockedUntil: until },
        reason: `${MAX_FAILED_SIGN_INS} wrong passwords in a row`,
        clientIp: caller.clientIp,
      });
      return until;
    });
    throw lockedUntil === null ? wrongPassword() : locked(lockedUntil);
  }
}

// 422, not 401: the session is fine, only the re-entered password is wrong (a 401 would make
// the client think its session expired).
function wrongPassword(): GyreException {
  return signoffError(
    SignoffError.WrongPassword,
    'password: does not match your password; the report was not signed.',
    { field: 'password' },
  );
}

function locked(lockedUntil: string): GyreException {
  return signoffError(
    SignoffError.AccountLocked,
    `Too many wrong passwords: your account is locked until ${lockedUntil}.`,
    { lockedUntil },
  );
}
