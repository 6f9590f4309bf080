import { EntityManager, EntityTarget, FindOptionsWhere, Not, ObjectLiteral } from 'typeorm';

/** Whether a database error is SQLite refusing a duplicate on a UNIQUE constraint. */
export function isUniqueViolation(error: unknown): boolean {
  if (typeof error !== 'object' || error === null) return false;
  const code = 'code' in error ? error.code : undefined;
  const driverError = 'driverError' in error ? error.driverError : undefined;
  if (code === 'SQLITE_CONSTRAINT_UNIQUE' || code === 'SQLITE_CONSTRAINT_PRIMARYKEY') return true;
  return driverError !== undefined && driverError !== error && isUniqueViolation(driverError);
}

/** Thrown by {@link assertUnique}; recognised by {@link isUniqueViolation} like SQLite's own. */
export class DuplicateRowError extends Error {
  readonly code = 'SQLITE_CONSTRAINT_UNIQUE';
}

/**
 * Looks for another row with the same unique values before writing, so that the usual
 * duplicate is a clean 409 rather than a constraint error in the log (the constraint stays
 * as the backstop). Call inside the write transaction.
 */
export async function assertUnique<T extends ObjectLiteral & { id: string }>(
  manager: EntityManager,
  entity: EntityTarget<T>,
  where: FindOptionsWhere<T>,
  id: string,
): Promise<void> {
  if (await manager.existsBy(entity, { ...where, id: Not(id) } as FindOptionsWhere<T>)) {
    throw new DuplicateRowError('duplicate');
  }
}
