import request from 'supertest';
import { createApp } from '../src/app.factory';
import { useTestApp } from './helpers/test-app';

describe('server shell on a real SQLite file', () => {
  const t = useTestApp({ seed: false });

  it('GET /api/health answers ok with every migration applied, without sign-in', async () => {
    const response = await request(t.url).get('/api/health');
    expect(response.status).toBe(200);
    expect(response.body.status).toBe('ok');
    expect(response.body.database.reachable).toBe(true);
    expect(response.body.migrations.pending).toBe(false);
    expect(response.body.migrations.applied).toBe(response.body.migrations.expected);
    expect(response.body.migrations.applied).toBeGreaterThanOrEqual(4);
  });

  it('runs the database in WAL mode (SQLite docs, "Write-Ahead Logging")', async () => {
    const rows: { journal_mode: string }[] = await t.dataSource.query('PRAGMA journal_mode');
    expect(rows[0].journal_mode).toBe('wal');
    const fk: { foreign_keys: number }[] = await t.dataSource.query('PRAGMA foreign_keys');
    expect(fk[0].foreign_keys).toBe(1);
  });

  it('serves the OpenAPI description listing the routes of auth, users and audit', async () => {
    const response = await request(t.url).get('/api/docs/openapi.json');
    expect(response.status).toBe(200);
    const paths = Object.keys(response.body.paths as Record<string, unknown>);
    for (const path of [
      '/api/auth/sign-in',
      '/api/auth/refresh',
      '/api/auth/me',
      '/api/users/invitations',
      '/api/studies',
      '/api/sites/{id}',
      '/api/participants',
      '/api/visits/{id}',
      '/api/audit',
      '/api/audit/verify',
      '/api/audit/export.csv',
      '/api/mail/outbox',
    ]) {
      expect(paths).toContain(path);
    }
    // A response schema never exposes the password hash.
    expect(JSON.stringify(response.body)).not.toMatch(/passwordHash/);
  });

  it('answers 401 on a closed route without a token', async () => {
    const response = await request(t.url).get('/api/participants');
    expect(response.status).toBe(401);
    expect(response.body.code).toBe('AUTH_TOKEN_INVALID');
  });
});

describe('bad environment', () => {
  it('PORT=abc stops createApp with the variable named', async () => {
    await expect(createApp({ env: { NODE_ENV: 'test', PORT: 'abc' } })).rejects.toThrow(
      /PORT="abc"/,
    );
  });

  it('SMTP_URL that is not an smtp URL stops createApp with the variable named', async () => {
    await expect(
      createApp({ env: { NODE_ENV: 'test', SMTP_URL: 'http://mail.example' } }),
    ).rejects.toThrow(/SMTP_URL/);
  });
});
