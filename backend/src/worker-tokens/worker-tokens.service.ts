import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { EntityManager, IsNull, Not, Repository } from 'typeorm';
import {
  LOCAL_WORKER_TOKEN_NAME,
  type CreatedWorkerTokenView,
  type Page,
  type WorkerTokenView,
} from '@gyre/shared';
import { AccountsService } from '../accounts/accounts.service';
import { AuditService } from '../audit/audit.service';
import type { Caller } from '../auth/decorators';
import { WriteTransactionsService } from '../common/database/write-transactions.service';
import { GyreException } from '../common/errors/gyre.exception';
import { isUniqueViolation } from '../common/errors/unique-violation';
import { pageSliceOf, pageWindowOf } from '../common/pagination/page-query.dto';
import { nowIso } from '../common/time';
import {
  CreateWorkerTokenDto,
  RevokeWorkerTokenDto,
  WorkerTokenQueryDto,
} from './dto/worker-token.dto';
import { WorkerToken } from './worker-token.entity';
import { newWorkerToken } from './worker-token-secret';
import { toWorkerTokenView } from './worker-token-view';
import { WorkerTokensError, workerTokensError } from './worker-tokens.errors';

/** The audit trail's object type for worker tokens (installation-wide: no study or site). */
const OBJECT_TYPE = 'WorkerToken';

/** Why the server revokes its local token at start, as the audit trail keeps it. */
export const LOCAL_ROTATION_REASON =
  'replaced at server start: the local worker token lives until the next start';

/**
 * Worker tokens for admins: create (the secret is returned once and only its hash stored),
 * list, revoke. Every creation and revocation is audited in the same transaction.
 */
@Injectable()
export class WorkerTokensService {
  constructor(
    @InjectRepository(WorkerToken) private readonly tokens: Repository<WorkerToken>,
    private readonly writes: WriteTransactionsService,
    private readonly audit: AuditService,
    private readonly accounts: AccountsService,
  ) {}

  async list(query: WorkerTokenQueryDto): Promise<Page<WorkerTokenView>> {
    const window = pageWindowOf(query, 'desc');
    const where =
      query.state === 'live'
        ? { revokedAt: IsNull() }
        : query.state === 'revoked'
          ? { revokedAt: Not(IsNull()) }
          : {};
    const [rows, total] = await this.tokens.findAndCount({
      where,
      ...pageSliceOf(window, 'createdAt'),
    });
    const names = await this.namesFor(rows);
    return {
      items: rows.map((row) => toWorkerTokenView(row, names)),
      total,
      page: window.page,
      pageSize: window.pageSize,
    };
  }

  async create(caller: Caller, dto: CreateWorkerTokenDto): Promise<CreatedWorkerTokenView> {
    if (dto.name.toLowerCase() === LOCAL_WORKER_TOKEN_NAME) {
      throw workerTokensError(
        WorkerTokensError.NameReserved,
        `name: "${LOCAL_WORKER_TOKEN_NAME}" is the server's own token; choose another name`,
        { field: 'name', value: dto.name },
      );
    }
    const issued = newWorkerToken();
    const row = await this.writes
      .run(async (manager) => {
        if (await this.liveNameTaken(manager, dto.name)) throw nameTaken(dto.name);
        return this.insert(manager, {
          id: issued.id,
          name: dto.name,
          secretHash: issued.secretHash,
          local: false,
          createdById: caller.user.id,
          clientIp: caller.clientIp,
          actor: caller.user,
        });
      })
      .catch((error: unknown) => {
        if (isUniqueViolation(error)) throw nameTaken(dto.name);
        throw error;
      });
    const view = toWorkerTokenView(row, new Map([[caller.user.id, caller.user.name]]));
    return { ...view, secret: issued.token };
  }

  async revoke(caller: Caller, id: string, dto: RevokeWorkerTokenDto): Promise<WorkerTokenView> {
    const revoked = await this.writes.run(async (manager) => {
      const current = await manager.findOneBy(WorkerToken, { id });
      if (current === null) {
        throw workerTokensError(WorkerTokensError.NotFound, `No worker token ${id}`, { id });
      }
      if (current.revokedAt !== null) {
        throw workerTokensError(
          WorkerTokensError.AlreadyRevoked,
          `The worker token "${current.name}" was already revoked on ${current.revokedAt}`,
          { id, revokedAt: current.revokedAt },
        );
      }
      const reason = dto.reason === undefined || dto.reason === '' ? null : dto.reason;
      return this.markRevoked(manager, current, {
        revokedById: caller.user.id,
        reason,
        actor: caller.user,
        clientIp: caller.clientIp,
      });
    });
    return toWorkerTokenView(revoked, await this.namesFor([revoked]));
  }

  /**
   * At server start: revokes the previous local token(s) and makes a new one, in one
   * transaction, audited as Gyre's own acts. Returns the new bearer value.
   */
  async replaceLocal(): Promise<string> {
    const issued = newWorkerToken();
    await this.writes.run(async (manager) => {
      const previous = await manager.findBy(WorkerToken, { local: true, revokedAt: IsNull() });
      for (const row of previous) {
        await this.markRevoked(manager, row, {
          revokedById: null,
          reason: LOCAL_ROTATION_REASON,
          actor: null,
          clientIp: null,
        });
      }
      await this.insert(manager, {
        id: issued.id,
        name: LOCAL_WORKER_TOKEN_NAME,
        secretHash: issued.secretHash,
        local: true,
        createdById: null,
        clientIp: null,
        actor: null,
      });
    });
    return issued.token;
  }

  private async insert(
    manager: EntityManager,
    fields: Pick<WorkerToken, 'id' | 'name' | 'secretHash' | 'local' | 'createdById'> & {
      actor: Caller['user'] | null;
      clientIp: string | null;
    },
  ): Promise<WorkerToken> {
    const row: WorkerToken = {
      id: fields.id,
      name: fields.name,
      secretHash: fields.secretHash,
      local: fields.local,
      createdAt: nowIso(),
      createdById: fields.createdById,
      lastUsedAt: null,
      revokedAt: null,
      revokedById: null,
      revokedReason: null,
    };
    await manager.insert(WorkerToken, row);
    await this.audit.record({
      actor: fields.actor,
      action: 'create',
      objectType: OBJECT_TYPE,
      objectId: row.id,
      studyId: null,
      siteId: null,
      after: toWorkerTokenView(row, this.actorNames(fields.actor)),
      clientIp: fields.clientIp,
    });
    return row;
  }

  private async markRevoked(
    manager: EntityManager,
    current: WorkerToken,
    change: {
      revokedById: string | null;
      reason: string | null;
      actor: Caller['user'] | null;
      clientIp: string | null;
    },
  ): Promise<WorkerToken> {
    const revoked: WorkerToken = {
      ...current,
      revokedAt: nowIso(),
      revokedById: change.revokedById,
      revokedReason: change.reason,
    };
    await manager.update(
      WorkerToken,
      { id: current.id, revokedAt: IsNull() },
      {
        revokedAt: revoked.revokedAt,
        revokedById: revoked.revokedById,
        revokedReason: revoked.revokedReason,
      },
    );
    const names = await this.namesFor([current], manager);
    for (const [id, name] of this.actorNames(change.actor)) names.set(id, name);
    await this.audit.record({
      actor: change.actor,
      action: 'revoke',
      objectType: OBJECT_TYPE,
      objectId: current.id,
      studyId: null,
      siteId: null,
      before: toWorkerTokenView(current, names),
      after: toWorkerTokenView(revoked, names),
      reason: change.reason,
      clientIp: change.clientIp,
    });
    return revoked;
  }

  private liveNameTaken(manager: EntityManager, name: string): Promise<boolean> {
    // COLLATE NOCASE, as the unique index that backs this check.
    return manager
      .createQueryBuilder(WorkerToken, 't')
      .where('t.name = :name COLLATE NOCASE', { name })
      .andWhere('t.revokedAt IS NULL')
      .getExists();
  }

  private namesFor(rows: WorkerToken[], manager?: EntityManager): Promise<Map<string, string>> {
    const ids = rows.flatMap((row) => [row.createdById, row.revokedById]);
    return this.accounts.namesOf(
      ids.filter((id): id is string => id !== null),
      manager,
    );
  }

  private actorNames(actor: Caller['user'] | null): Map<string, string> {
    return actor === null ? new Map() : new Map([[actor.id, actor.name]]);
  }
}

function nameTaken(name: string): GyreException {
  return workerTokensError(
    WorkerTokensError.NameTaken,
    `name: a live worker token is already called "${name}"; revoke it or choose another name`,
    { field: 'name', value: name },
  );
}
