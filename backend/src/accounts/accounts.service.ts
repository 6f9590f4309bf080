import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { EntityManager, FindOptionsOrder, FindOptionsWhere, In, Repository } from 'typeorm';
import { SqliteReadsService } from '../common/database/sqlite-reads.service';
import { User } from './user.entity';

/** What every request's sign-in check needs of its user. */
export type SignedInFacts = Pick<
  User,
  'id' | 'email' | 'name' | 'role' | 'studyId' | 'siteId' | 'state'
>;

/** What a caller may change when an invitation is accepted. */
export interface Activation {
  name: string;
  passwordHash: string;
  at: string;
}

/**
 * The one owner of the `user` rows: auth, users, sign-off and the demo seeder read and write
 * accounts through these methods only. Unscoped; `tx` runs inside the caller's write transaction.
 */
@Injectable()
export class AccountsService {
  constructor(
    @InjectRepository(User) private readonly users: Repository<User>,
    private readonly reads: SqliteReadsService,
  ) {}

  byEmail(email: string, tx?: EntityManager): Promise<User | null> {
    return this.repo(tx).findOneBy({ email });
  }

  /** The user or null. */
  findById(id: string, tx?: EntityManager): Promise<User | null> {
    return this.repo(tx).findOneBy({ id });
  }

  /**
   * The columns the sign-in guard checks on every request, read live by a prepared statement
   * (the query builder cost more than the rest of a light request).
   */
  signedInFacts(id: string): SignedInFacts | null {
    return this.reads.one<SignedInFacts>(
      `SELECT "id", "email", "name", "role", "studyId", "siteId", "state" FROM "user" WHERE "id" = ?`,
      [id],
    );
  }

  /** For an id that must exist (throws `EntityNotFoundError` otherwise). */
  byId(id: string, tx?: EntityManager): Promise<User> {
    return this.repo(tx).findOneByOrFail({ id });
  }

  /** The first row matching `where` (which may be a list of OR branches, e.g. a scope). */
  findOneWhere(where: FindOptionsWhere<User>[], tx?: EntityManager): Promise<User | null> {
    return this.repo(tx).findOne({ where });
  }

  /** One page of rows matching `where` (OR branches), and how many match in all. */
  findPage(
    query: {
      where: FindOptionsWhere<User>[];
      order: FindOptionsOrder<User>;
      skip: number;
      take: number;
    },
    tx?: EntityManager,
  ): Promise<[User[], number]> {
    return this.repo(tx).findAndCount(query);
  }

  /** Display names by user id (unknown ids are left out). */
  async namesOf(ids: string[], tx?: EntityManager): Promise<Map<string, string>> {
    const unique = [...new Set(ids)];
    if (unique.length === 0) return new Map();
    const users = await this.repo(tx).find({
      where: { id: In(unique) },
      select: { id: true, name: true },
    });
    return new Map(users.map((u) => [u.id, u.name]));
  }

  /** The active coordinators of one site, by e-mail address. */
  activeCoordinatorsOf(studyId: string, siteId: string, tx?: EntityManager): Promise<User[]> {
    return this.repo(tx).find({
      where: { role: 'coordinator', studyId, siteId, state: 'active' },
      order: { email: 'ASC' },
    });
  }

  emailTaken(email: string, tx?: EntityManager): Promise<boolean> {
    return this.repo(tx).existsBy({ email });
  }

  count(tx?: EntityManager): Promise<number> {
    return this.repo(tx).count();
  }

  async insert(user: User, tx: EntityManager): Promise<void> {
    await tx.insert(User, user);
  }

  /** Writes the whole row (profile, role, membership, state) as the caller built it. */
  async save(user: User, tx: EntityManager): Promise<void> {
    await tx.save(User, user);
  }

  /** A successful sign-in clears the wrong-password count and any lock. */
  async recordSignIn(id: string, at: string, tx: EntityManager): Promise<void> {
    await tx.update(User, { id }, { failedSignIns: 0, lockedUntil: null, lastSignInAt: at });
  }

  /** A new password (change or reset) also lifts a lock; ending sessions is the caller's job. */
  async setPasswordHash(
    id: string,
    passwordHash: string,
    at: string,
    tx: EntityManager,
  ): Promise<void> {
    await tx.update(
      User,
      { id },
      { passwordHash, passwordChangedAt: at, updatedAt: at, failedSignIns: 0, lockedUntil: null },
    );
  }

  /** An accepted invitation: the account becomes active with its first password. */
  async activateInvited(id: string, activation: Activation, tx: EntityManager): Promise<void> {
    const { name, passwordHash, at } = activation;
    await tx.update(
      User,
      { id },
      { state: 'active', name, passwordHash, passwordChangedAt: at, updatedAt: at },
    );
  }

  async clearFailedSignIns(id: string, tx: EntityManager): Promise<void> {
    await tx.update(User, { id }, { failedSignIns: 0 });
  }

  /** Counts one more wrong password; answers the count now stored. */
  async addFailedSignIn(id: string, tx: EntityManager): Promise<number> {
    await tx.increment(User, { id }, 'failedSignIns', 1);
    return (await this.byId(id, tx)).failedSignIns;
  }

  /** Locks the account until `until` and starts the wrong-password count again. */
  async lockUntil(id: string, until: string, tx: EntityManager): Promise<void> {
    await tx.update(User, { id }, { failedSignIns: 0, lockedUntil: until });
  }

  private repo(tx: EntityManager | undefined): Repository<User> {
    return tx?.getRepository(User) ?? this.users;
  }
}
