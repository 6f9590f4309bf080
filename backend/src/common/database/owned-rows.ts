import type { EntityManager, FindOptionsWhere, ObjectLiteral, Repository } from 'typeorm';
import { In } from 'typeorm';
import type { Action, SubjectName } from '@gyre/shared';
import { scopedWhere } from '../../auth/access-scope';
import type { Caller } from '../../auth/decorators';
import type { GyreException } from '../errors/gyre.exception';

/** A row with a string id (every study-model table). */
type IdRow = ObjectLiteral & { id: string };

/**
 * The reads by id that the owner of a table offers other modules (one owner per table,
 * docs/architecture.md): unscoped, because the caller's scope was checked where the id came
 * from, and inside the other module's write transaction when it passes its `manager`.
 */
export abstract class OwnedRows<Row extends IdRow> {
  protected constructor(protected readonly repository: Repository<Row>) {}

  /** For other modules holding the id (unscoped); `manager` reads inside their transaction. */
  byId(id: string, manager?: EntityManager): Promise<Row> {
    return this.repo(manager).findOneByOrFail({ id } as FindOptionsWhere<Row>);
  }

  /** For other modules, unscoped: the row, or null when there is none. */
  findById(id: string, manager?: EntityManager): Promise<Row | null> {
    return this.repo(manager).findOneBy({ id } as FindOptionsWhere<Row>);
  }

  /** For other modules, unscoped: the rows among `ids` (missing ones are left out). */
  async byIds(ids: string[], manager?: EntityManager): Promise<Row[]> {
    const wanted = [...new Set(ids)];
    if (wanted.length === 0) return [];
    return this.repo(manager).find({ where: { id: In(wanted) } as FindOptionsWhere<Row> });
  }

  /** The table's repository, or the one of the transaction `manager` belongs to. */
  protected repo(manager: EntityManager | undefined): Repository<Row> {
    return manager?.getRepository<Row>(this.repository.target) ?? this.repository;
  }
}

/**
 * A table whose rows the API hands out one at a time under the caller's CASL scope: a row
 * outside the scope answers the owner's 404, exactly like one that does not exist.
 */
export abstract class ScopedRows<Row extends IdRow> extends OwnedRows<Row> {
  protected constructor(
    repository: Repository<Row>,
    private readonly subjectName: SubjectName,
    private readonly notFound: (id: string) => GyreException,
  ) {
    super(repository);
  }

  /** The row `id` if the caller may `action` it, else the owner's 404. */
  findInScope(caller: Caller, action: Action, id: string): Promise<Row> {
    return this.findInScopeOf(caller, action, this.subjectName, id, this.notFound);
  }

  /**
   * For other modules: the row if the caller may `action` a `subjectName` of it (that
   * subject's scope, applied to this row in the query), else the asking module's 404.
   */
  async findInScopeOf(
    caller: Caller,
    action: Action,
    subjectName: SubjectName,
    id: string,
    notFound: (id: string) => GyreException,
  ): Promise<Row> {
    const row = await this.repository.findOne({
      where: scopedWhere<Row>(caller.ability, action, subjectName, { id } as FindOptionsWhere<Row>),
    });
    if (row === null) throw notFound(id);
    return row;
  }
}
