import request from 'supertest';
import type { UserKey } from './seed';
import type { TestApp } from './test-app';

/**
 * The study's current analysis settings as `user` reads them: the version number, and its
 * values as POST /api/studies/:studyId/analysis-settings takes them back (the version's own
 * fields, id, author, date, reason and changes, left out).
 */
export async function currentSettings(
  t: TestApp,
  studyId: string,
  user: UserKey = 'analyst',
): Promise<{ version: number; values: Record<string, unknown> }> {
  const response = await request(t.url)
    .get(`/api/studies/${studyId}/analysis-settings`)
    .set(await t.authHeader(user));
  expect(response.status).toBe(200);
  const {
    id: _id,
    studyId: _studyId,
    version,
    createdById: _createdById,
    createdAt: _createdAt,
    reason: _reason,
    changes: _changes,
    ...values
  } = response.body as Record<string, unknown>;
  return { version: version as number, values };
}
