import { Inject, Injectable } from '@nestjs/common';
import { EntityManager } from 'typeorm';
import { membershipOf, type Page, type Role, type UserView } from '@gyre/shared';
import { AccountsService } from '../accounts/accounts.service';
import { User } from '../accounts/user.entity';
import { scopedWhere } from '../auth/access-scope';
import { Caller } from '../auth/decorators';
import { aRole } from '../auth/role-wording';
import { OneTimeTokensService } from '../auth/one-time-tokens.service';
import { RefreshTokensService } from '../auth/refresh-tokens.service';
import { AuditService } from '../audit/audit.service';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { GyreException } from '../common/errors/gyre.exception';
import { isUniqueViolation } from '../common/errors/unique-violation';
import { pageSliceOf, pageWindowOf } from '../common/pagination/page-query.dto';
import { toPage } from '../common/pagination/page';
import { givenFields } from '../common/given-fields';
import { scopedSearchWhere } from '../common/pagination/list-where';
import { nowIso } from '../common/time';
import type { AppConfig } from '../config/app.config';
import { APP_CONFIG } from '../config/config.module';
import { clientLink, invitationMail } from '../mail/mail-templates';
import { OutboxService } from '../mail/outbox.service';
import { SitesService } from '../sites/sites.service';
import { StudiesService } from '../studies/studies.service';
import { InviteUserDto, UpdateUserDto, UserQueryDto } from './dto/user.dto';
import { newUserRow } from './new-user-row';
import { toUserView } from './user-view';
import { UsersError, usersError } from './users.errors';

@Injectable()
export class UsersService {
  constructor(
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    private readonly accounts: AccountsService,
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
    private readonly outbox: OutboxService,
    private readonly oneTimeTokens: OneTimeTokensService,
    private readonly refreshTokens: RefreshTokensService,
    private readonly studies: StudiesService,
    private readonly sites: SitesService,
  ) {}

  async list(caller: Caller, query: UserQueryDto): Promise<Page<UserView>> {
    const window = pageWindowOf(query);
    const filter = givenFields(query, ['role', 'state', 'studyId', 'siteId']);
    // E-mail addresses are stored lower-cased; LIKE folds only ASCII letters.
    const search =
      query.q === undefined ? undefined : { name: query.q, email: query.q.toLowerCase() };
    const rows = await this.accounts.findPage({
      where: scopedSearchWhere<User>(caller.ability, 'User', filter, search),
      ...pageSliceOf(window, query.sort ?? 'email'),
    });
    return toPage(rows, window, toUserView);
  }

  async get(caller: Caller, id: string): Promise<UserView> {
    return toUserView(await this.findInScope(caller, 'read', id));
  }

  /** Creates the account in state `invited` and e-mails a single-use link to choose a password. */
  async invite(caller: Caller, dto: InviteUserDto): Promise<UserView> {
    const at = nowIso();
    const user = await this.writes
      .run(async (manager) => {
        // Checked first so that the usual case is a clean 409, not a logged constraint error.
        if (await this.accounts.emailTaken(dto.email, manager)) throw emailTaken(dto.email);
        const membership = await this.checkMembership(
          manager,
          dto.role,
          dto.studyId ?? null,
          dto.siteId ?? null,
        );
        const created = newUserRow(
          { email: dto.email, name: dto.name.trim(), role: dto.role, ...membership },
          null,
          at,
        );
        await this.accounts.insert(created, manager);
        await this.audit.recordBy(caller, created, {
          action: 'invite',
          objectType: 'User',
          objectId: created.id,
          after: toUserView(created),
        });
        await this.sendInvitation(manager, created);
        return created;
      })
      .catch((error: unknown) => {
        if (isUniqueViolation(error)) throw emailTaken(dto.email);
        throw error;
      });
    this.outbox.kick();
    return toUserView(user);
  }

  /** A fresh invitation link; the previous one stops working. */
  async resendInvitation(caller: Caller, id: string): Promise<UserView> {
    const user = await this.findInScope(caller, 'invite', id);
    if (user.state !== 'invited') {
      throw usersError(UsersError.NotInvited, `The account is ${user.state}, not invited`, {
        state: user.state,
      });
    }
    await this.writes.run(async (manager) => {
      await this.sendInvitation(manager, user);
      await this.audit.recordBy(caller, user, {
        action: 'invite',
        objectType: 'User',
        objectId: user.id,
        reason: 'invitation sent again; the earlier link no longer works',
      });
    });
    this.outbox.kick();
    return toUserView(user);
  }

  async update(caller: Caller, id: string, dto: UpdateUserDto): Promise<UserView> {
    const current = await this.findInScope(caller, 'update', id);
    if (
      current.id === caller.user.id &&
      (dto.state === 'deactivated' || (dto.role !== undefined && dto.role !== current.role))
    ) {
      throw usersError(
        UsersError.SelfLockout,
        'You cannot deactivate yourself or change your own role; ask another admin',
      );
    }
    const role = dto.role ?? current.role;
    const next = await this.writes.run(async (manager) => {
      const membership = await this.checkMembership(
        manager,
        role,
        dto.studyId !== undefined ? dto.studyId : current.studyId,
        dto.siteId !== undefined ? dto.siteId : current.siteId,
      );
      if (dto.state === 'active' && current.state === 'invited') {
        throw usersError(
          UsersError.NotInvited,
          'state: an invited account becomes active only when the invitation is accepted',
          { field: 'state' },
        );
      }
      const updated: User = {
        ...current,
        name: dto.name?.trim() ?? current.name,
        role,
        ...membership,
        state: dto.state ?? current.state,
        updatedAt: nowIso(),
      };
      await this.accounts.save(updated, manager);
      const roleChanged =
        updated.role !== current.role ||
        updated.studyId !== current.studyId ||
        updated.siteId !== current.siteId;
      if (updated.state === 'deactivated' && current.state !== 'deactivated') {
        await this.refreshTokens.revokeAllOfUser(manager, current.id, 'deactivated');
      } else if (roleChanged) {
        // A session carries its holder's rights: a new role starts with a new sign-in.
        await this.refreshTokens.revokeAllOfUser(manager, current.id, 'role-change');
      }
      await this.audit.recordBy(
        caller,
        { studyId: updated.studyId ?? current.studyId, siteId: updated.siteId ?? current.siteId },
        {
          action: roleChanged ? 'role-change' : 'update',
          objectType: 'User',
          objectId: current.id,
          before: toUserView(current),
          after: toUserView(updated),
          reason: dto.reason ?? null,
        },
      );
      return updated;
    });
    return toUserView(next);
  }

  private async sendInvitation(manager: EntityManager, user: User): Promise<void> {
    const { secret, expiresAt } = await this.oneTimeTokens.issue(manager, user.id, 'invitation');
    const study = user.studyId === null ? null : await this.studies.findById(user.studyId, manager);
    const site = user.siteId === null ? null : await this.sites.findById(user.siteId, manager);
    const where = [study?.name ?? 'the whole installation', site?.name].filter(Boolean).join(', ');
    await this.outbox.enqueue(
      manager,
      user.email,
      invitationMail({
        name: user.name,
        roleLabel: user.role,
        where,
        link: clientLink(this.config.publicUrl, '/accept-invite', secret),
        expiresAt,
      }),
    );
  }

  /** Role and membership must agree: admins belong to no study, site roles to one site of it. */
  private async checkMembership(
    manager: EntityManager,
    role: Role,
    studyId: string | null,
    siteId: string | null,
  ): Promise<{ studyId: string | null; siteId: string | null }> {
    const kind = membershipOf(role);
    const refuse = (field: string, message: string, value: unknown): never => {
      throw usersError(UsersError.MembershipInvalid, `${field}: ${message}`, {
        field,
        value,
        role,
      });
    };
    if (kind === 'installation') return { studyId: null, siteId: null };
    if (studyId === null) {
      return refuse('studyId', `${aRole(role)} must belong to a study`, studyId);
    }
    if (!(await this.studies.exists(studyId, manager))) {
      return refuse('studyId', `no study ${studyId}`, studyId);
    }
    if (kind === 'study') return { studyId, siteId: null };
    if (siteId === null) return refuse('siteId', `${aRole(role)} must belong to a site`, siteId);
    if (!(await this.sites.existsInStudy(siteId, studyId, manager))) {
      return refuse('siteId', `no site ${siteId} in study ${studyId}`, siteId);
    }
    return { studyId, siteId };
  }

  /** For other modules, unscoped: display names by user id (unknown ids are left out). */
  namesOf(ids: string[], manager?: EntityManager): Promise<Map<string, string>> {
    return this.accounts.namesOf(ids, manager);
  }

  /** For other modules, unscoped: the active coordinators of one site, by e-mail address. */
  activeCoordinatorsOf(studyId: string, siteId: string, manager?: EntityManager): Promise<User[]> {
    return this.accounts.activeCoordinatorsOf(studyId, siteId, manager);
  }

  private async findInScope(
    caller: Caller,
    action: 'read' | 'update' | 'invite',
    id: string,
  ): Promise<User> {
    const user = await this.accounts.findOneWhere(
      scopedWhere<User>(caller.ability, action, 'User', { id }),
    );
    if (user === null) {
      throw usersError(UsersError.NotFound, `No user ${id}`, { id });
    }
    return user;
  }
}

function emailTaken(email: string): GyreException {
  return usersError(UsersError.EmailTaken, `email: ${email} already has an account`, {
    field: 'email',
    value: email,
  });
}
