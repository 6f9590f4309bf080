import request from 'supertest';
import type { AuditEntryView } from '@gyre/shared';
import type { TestApp } from './test-app';

/** One page of GET /api/audit as `user` reads it (asserting 200). */
export async function auditEntries(
  t: TestApp,
  user: 'monitor' | 'monitorB' | 'admin',
  query: Record<string, string | number> = {},
): Promise<{ items: AuditEntryView[]; total: number }> {
  const response = await request(t.url)
    .get('/api/audit')
    .query(query)
    .set(await t.authHeader(user));
  expect(response.status).toBe(200);
  return response.body as { items: AuditEntryView[]; total: number };
}
