import request from 'supertest';
import { startTestApp, TestApp } from './helpers/test-app';

describe('smoke', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await startTestApp();
  });
  afterAll(async () => {
    await t.close();
  });

  it('signs in and answers /api/auth/me', async () => {
    const response = await request(t.url)
      .get('/api/auth/me')
      .set(await t.authHeader('technician'));
    expect(response.status).toBe(200);
    expect(response.body.user.role).toBe('technician');
  });
});
