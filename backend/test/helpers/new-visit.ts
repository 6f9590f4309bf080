import request from 'supertest';
import type { VisitView } from '@gyre/shared';
import type { TestApp } from './test-app';

/** An unscheduled visit of participant A1 registered by its technician (201 expected): its id. */
export async function newVisit(
  t: TestApp,
  label: string,
  visitDate = '2026-03-02',
): Promise<string> {
  const response = await request(t.url)
    .post('/api/visits')
    .set(await t.authHeader('technician'))
    .send({ participantId: t.seed.participants.A1.id, label, visitDate });
  expect(response.status).toBe(201);
  return (response.body as VisitView).id;
}
