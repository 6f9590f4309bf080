import { FindOperator, Raw } from 'typeorm';

let parameterCount = 0;

/**
 * `?q=` as a case-insensitive substring match (SQLite LIKE is ASCII case-insensitive).
 * `\`, `%` and `_` in `q` match themselves: they are escaped, and SQLite's LIKE knows no
 * escape character unless the ESCAPE clause names one.
 */
export function containsText(q: string): FindOperator<string> {
  // Unique per call: two filters in one query (code OR name) must not share a parameter.
  const name = `containsText${++parameterCount}`;
  return Raw((column) => `${column} LIKE :${name} ESCAPE '\\'`, { [name]: likePattern(q) });
}

/** The LIKE pattern of `containsText`, for raw SQL: `column LIKE ? ESCAPE '\'`. */
export function likePattern(q: string): string {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}
