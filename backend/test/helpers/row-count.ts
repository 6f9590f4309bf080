import type { TestApp } from './test-app';

/** How many rows `table` holds now. */
export async function countOf(t: TestApp, table: string): Promise<number> {
  const rows = (await t.dataSource.query(`SELECT count(*) AS n FROM "${table}"`)) as Array<{
    n: number;
  }>;
  return Number(rows[0].n);
}
