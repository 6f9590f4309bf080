import { Injectable } from '@nestjs/common';
import { InjectDataSource } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import type { UserView } from '@gyre/shared';
import { AccountsService } from '../accounts/accounts.service';
import { AuditService } from '../audit/audit.service';
import { assertPasswordAcceptable } from '../auth/password-policy';
import { PasswordHasherService } from '../auth/password-hasher.service';
import { nowIso } from '../common/time';
import { newUserRow } from '../users/new-user-row';
import { toUserView } from '../users/user-view';

export interface FirstAdminInput {
  email: string;
  name: string;
  password: string;
}

export type FirstAdminOutcome =
  | { created: true; user: UserView }
  /** Someone already has an account: the installation is not empty, nothing was written. */
  | { created: false; existingUsers: number };

/**
 * The one thing the demo seeder cannot do through the API: create the very first account of
 * an empty installation (every other account is invited by an admin). Everything after it —
 * study, sites, invitations, participants, visits, uploads, flags — goes through the HTTP API.
 */
@Injectable()
export class DemoSeedService {
  constructor(
    @InjectDataSource() private readonly dataSource: DataSource,
    private readonly audit: AuditService,
    private readonly hasher: PasswordHasherService,
    private readonly accounts: AccountsService,
  ) {}

  /** Creates an active admin when there is no user at all; audited as done by the system. */
  async createFirstAdmin(input: FirstAdminInput): Promise<FirstAdminOutcome> {
    const email = input.email.trim().toLowerCase();
    assertPasswordAcceptable(input.password, { field: 'password', email });
    const passwordHash = await this.hasher.hash(input.password);
    return this.dataSource.transaction(async (manager) => {
      const existingUsers = await this.accounts.count(manager);
      if (existingUsers > 0) return { created: false, existingUsers };
      const at = nowIso();
      const user = newUserRow(
        { email, name: input.name.trim(), role: 'admin', studyId: null, siteId: null },
        passwordHash,
        at,
      );
      await this.accounts.insert(user, manager);
      const view = toUserView(user);
      await this.audit.record({
        actor: null,
        action: 'create',
        objectType: 'User',
        objectId: user.id,
        studyId: null,
        siteId: null,
        after: view,
        reason: 'First administrator of an empty installation, created by the demo seeder',
      });
      return { created: true, user: view };
    });
  }
}
