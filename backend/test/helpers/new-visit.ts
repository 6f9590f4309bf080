import request from 'supertest';
import type { VisitView } from '@gyre/shared';
import type { TestApp } from './test-app';

/**
 * An unscheduled visit of the participant at site A1 (or A2) registered by that site's
 * technician (201 expected): its id.
 */
export async function newVisit(
  t: TestApp,
  label: string,
  visitDate = '2026-03-02',
  site: 'A1' | 'A2' = 'A1',
): Promise<string> {
  const response = await request(t.url)
    .post('/api/visits')
    .set(await t.authHeader(site === 'A1' ? 'technician' : 'technicianA2'))
    .send({ participantId: t.seed.participants[site].id, label, visitDate });
  expect(response.status).toBe(201);
  return (response.body as VisitView).id;
}
