/** Whether a database error is SQLite refusing a duplicate on a UNIQUE constraint. */
export function isUniqueViolation(error: unknown): boolean {
  if (typeof error !== 'object' || error === null) return false;
  const code = 'code' in error ? error.code : undefined;
  const driverError = 'driverError' in error ? error.driverError : undefined;
  if (code === 'SQLITE_CONSTRAINT_UNIQUE' || code === 'SQLITE_CONSTRAINT_PRIMARYKEY') return true;
  return driverError !== undefined && driverError !== error && isUniqueViolation(driverError);
}
