import {
  And,
  Brackets,
  Equal,
  FindOperator,
  FindOptionsWhere,
  In,
  IsNull,
  ObjectLiteral,
  SelectQueryBuilder,
} from 'typeorm';
import type { Action, AppAbility, SubjectName } from '@gyre/shared';
import { AuthError, authError } from './auth.errors';

/**
 * Row-level scoping inside the query. The user's CASL rules for (action, subject) become a
 * list of column conditions OR-ed together; a row outside them is never loaded, so the
 * service answers 404 for it, exactly as for a row that does not exist.
 *
 * Supported conditions: equality (`{ studyId: 'x' }`) and `{ $in: [...] }`, which is all
 * Gyre's rules use. An empty list is never returned: no matching rule means 403.
 */
export type ScopeConditions = Record<string, string | number | boolean | null | { $in: unknown[] }>;

/** Each element is one OR branch; `{}` (no conditions) means the whole table. */
export function scopeConditionsOf(
  ability: AppAbility,
  action: Action,
  subjectName: SubjectName,
): ScopeConditions[] {
  const branches: ScopeConditions[] = [];
  // rulesFor lists the relevant rules highest priority first (later rules win in CASL).
  for (const rule of ability.rulesFor(action, subjectName)) {
    const conditions = rule.conditions as Record<string, unknown> | undefined;
    if (rule.inverted) {
      if (conditions === undefined) break; // an unconditional `cannot` hides all lower rules
      throw new Error(
        `Conditional "cannot" rules are not supported in queries (${action} ${subjectName})`,
      );
    }
    if (conditions === undefined) return [{}];
    branches.push(validated(conditions, action, subjectName));
  }
  if (branches.length === 0) {
    throw authError(AuthError.Forbidden, `You may not ${action} ${subjectName}.`, {
      action,
      subject: subjectName,
    });
  }
  return branches;
}

function validated(
  conditions: Record<string, unknown>,
  action: Action,
  subjectName: SubjectName,
): ScopeConditions {
  const out: ScopeConditions = {};
  for (const [field, value] of Object.entries(conditions)) {
    if (
      value === null ||
      typeof value === 'string' ||
      typeof value === 'number' ||
      typeof value === 'boolean'
    ) {
      out[field] = value;
    } else if (
      typeof value === 'object' &&
      Object.keys(value).length === 1 &&
      '$in' in value &&
      Array.isArray(value.$in)
    ) {
      out[field] = { $in: value.$in };
    } else {
      throw new Error(
        `Unsupported condition on ${field} for ${action} ${subjectName}: ${JSON.stringify(value)}`,
      );
    }
  }
  return out;
}

/**
 * A TypeORM `where` for `find`/`findOne`/`findAndCount`: the scope AND `extra` (e.g. `{ id }`
 * or list filters). Returns an array of OR branches, as TypeORM expects.
 */
export function scopedWhere<T extends ObjectLiteral>(
  ability: AppAbility,
  action: Action,
  subjectName: SubjectName,
  extra: FindOptionsWhere<T> = {},
): FindOptionsWhere<T>[] {
  return scopeConditionsOf(ability, action, subjectName).map((branch) => {
    const where: Record<string, unknown> = { ...extra };
    for (const [field, value] of Object.entries(branch)) {
      // TypeORM refuses a bare null in `where` (invalidWhereValuesBehavior defaults to throw).
      const scope = value === null ? IsNull() : typeof value === 'object' ? In(value.$in) : value;
      // A filter on a scoped column is AND-ed with the scope: it may narrow it, never widen it.
      where[field] =
        field in extra
          ? And(asOperator(extra[field as keyof typeof extra]), asOperator(scope))
          : scope;
    }
    return where as FindOptionsWhere<T>;
  });
}

function asOperator(value: unknown): FindOperator<unknown> {
  return value instanceof FindOperator ? value : Equal(value);
}

/** For query builders: adds `AND ((alias.f1 = :p AND …) OR (…))` with bound parameters. */
export function applyScope<T extends ObjectLiteral>(
  query: SelectQueryBuilder<T>,
  alias: string,
  ability: AppAbility,
  action: Action,
  subjectName: SubjectName,
): SelectQueryBuilder<T> {
  const branches = scopeConditionsOf(ability, action, subjectName);
  if (branches.some((branch) => Object.keys(branch).length === 0)) return query;
  const prefix = `scope_${alias}_${subjectName}`.replace(/\W/g, '_');
  return query.andWhere(
    new Brackets((outer) => {
      branches.forEach((branch, b) => {
        outer.orWhere(
          new Brackets((inner) => {
            for (const [field, value] of Object.entries(branch)) {
              const name = `${prefix}_${b}_${field}`;
              if (value === null) inner.andWhere(`${alias}.${field} IS NULL`);
              else if (typeof value === 'object') {
                inner.andWhere(`${alias}.${field} IN (:...${name})`, { [name]: value.$in });
              } else inner.andWhere(`${alias}.${field} = :${name}`, { [name]: value });
            }
          }),
        );
      });
    }),
  );
}

/** A condition for raw SQL: its text with `?` placeholders and the values, in order. */
export interface ScopeSql {
  sql: string;
  params: (string | number | null)[];
}

const COLUMN_NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;

/**
 * For raw SQL (`SqliteReadsService`): `((alias."f1" = ? AND …) OR (…))` with its values, or `1`
 * when the scope is the whole table; the same rules and the same 404 as `scopedWhere`.
 */
export function scopeSql(
  ability: AppAbility,
  action: Action,
  subjectName: SubjectName,
  alias: string,
): ScopeSql {
  const branches = scopeConditionsOf(ability, action, subjectName);
  if (branches.some((branch) => Object.keys(branch).length === 0)) return { sql: '1', params: [] };
  const params: (string | number | null)[] = [];
  const bind = (value: unknown): string => {
    if (typeof value === 'boolean') params.push(value ? 1 : 0);
    else if (typeof value === 'string' || typeof value === 'number') params.push(value);
    else throw new Error(`Unsupported value in a scope for SQL: ${JSON.stringify(value)}`);
    return '?';
  };
  const ors = branches.map((branch) => {
    const ands = Object.entries(branch).map(([field, value]) => {
      if (!COLUMN_NAME.test(field) || !COLUMN_NAME.test(alias)) {
        throw new Error(`Not a column: ${alias}.${field}`);
      }
      const column = `${alias}."${field}"`;
      if (value === null) return `${column} IS NULL`;
      if (typeof value === 'object') {
        return value.$in.length === 0
          ? '0'
          : `${column} IN (${value.$in.map((v) => bind(v)).join(', ')})`;
      }
      return `${column} = ${bind(value)}`;
    });
    return `(${ands.join(' AND ')})`;
  });
  return { sql: `(${ors.join(' OR ')})`, params };
}

/**
 * The simple `{ studyId, siteId? }` scope of a user's membership, for code that only needs
 * "which study and site does this user belong to" (admins: no restriction).
 */
export function membershipScope(user: { studyId: string | null; siteId: string | null }): {
  studyId?: string;
  siteId?: string;
} {
  const scope: { studyId?: string; siteId?: string } = {};
  if (user.studyId !== null) scope.studyId = user.studyId;
  if (user.siteId !== null) scope.siteId = user.siteId;
  return scope;
}
