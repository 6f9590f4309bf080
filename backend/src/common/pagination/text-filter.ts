import { FindOperator, Like } from 'typeorm';

/** `?q=` as a case-insensitive substring match (SQLite LIKE is ASCII case-insensitive). */
export function containsText(q: string): FindOperator<string> {
  return Like(`%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`);
}
