import { createHash } from 'node:crypto';
import request from 'supertest';
import type { AuditEntryView } from '@gyre/shared';
import { auditEntries } from './helpers/audit-entries';
import { useTestApp } from './helpers/test-app';
import { getAs } from './helpers/api-call';

/** hash = SHA-256(prevHash ‖ canonical JSON), recomputed here independently of the server. */
function expectedHash(
  entry: AuditEntryView,
  beforeText: string | null,
  afterText: string | null,
): string {
  const content: Record<string, unknown> = {
    action: entry.action,
    actorEmail: entry.actorEmail,
    actorId: entry.actorId,
    after: afterText,
    at: entry.at,
    before: beforeText,
    clientIp: entry.clientIp,
    objectId: entry.objectId,
    objectType: entry.objectType,
    reason: entry.reason,
    seq: entry.seq,
    siteId: entry.siteId,
    studyId: entry.studyId,
  };
  return createHash('sha256').update(entry.prevHash).update(JSON.stringify(content)).digest('hex');
}

describe('audit trail', () => {
  const t = useTestApp();

  it('a create and an update each write an entry with actor, before, after, reason and address', async () => {
    const technician = await t.authHeader('technician');
    const created = await request(t.url)
      .post('/api/participants')
      .set(technician)
      .send({ code: 'AU-0001' });
    expect(created.status).toBe(201);
    const updated = await request(t.url)
      .patch(`/api/participants/${created.body.id as string}`)
      .set(technician)
      .send({ code: 'AU-0002', reason: 'transcription error' });
    expect(updated.status).toBe(200);

    const { items } = await auditEntries(t, 'monitor', {
      objectId: created.body.id as string,
      order: 'asc',
    });
    expect(items.map((e) => e.action)).toEqual(['create', 'update']);
    const [create, update] = items;
    expect(create.actorId).toBe(t.seed.users.technician.id);
    expect(create.actorEmail).toBe(t.seed.users.technician.email);
    expect(create.objectType).toBe('Participant');
    expect(create.before).toBeNull();
    expect((create.after as { code: string }).code).toBe('AU-0001');
    expect((update.before as { code: string }).code).toBe('AU-0001');
    expect((update.after as { code: string }).code).toBe('AU-0002');
    expect(update.reason).toBe('transcription error');
    expect(update.clientIp).toMatch(/127\.0\.0\.1/);
    expect(update.studyId).toBe(t.seed.studies.A.id);
    expect(update.siteId).toBe(t.seed.sites.A1.id);
    expect(Date.parse(update.at)).not.toBeNaN();
  });

  it('each hash is SHA-256 of the previous hash and the entry’s canonical JSON (recomputed here)', async () => {
    const { items } = await auditEntries(t, 'admin', { order: 'asc', pageSize: 200 });
    expect(items.length).toBeGreaterThan(3);
    for (let i = 0; i < items.length; i += 1) {
      const entry = items[i];
      const [row] = (await t.dataSource.query(
        `SELECT "before", "after" FROM "audit_entry" WHERE "seq" = ?`,
        [entry.seq],
      )) as { before: string | null; after: string | null }[];
      expect(entry.hash).toBe(expectedHash(entry, row.before, row.after));
      expect(entry.prevHash).toBe(i === 0 ? '0'.repeat(64) : items[i - 1].hash);
    }
  });

  it('a role change is recorded as role-change with before and after', async () => {
    const response = await request(t.url)
      .patch(`/api/users/${t.seed.users.technicianA2.id}`)
      .set(await t.authHeader('admin'))
      .send({ role: 'coordinator', reason: 'moves to coordination' });
    expect(response.status).toBe(200);
    const { items } = await auditEntries(t, 'admin', {
      action: 'role-change',
      objectId: t.seed.users.technicianA2.id,
    });
    expect(items).toHaveLength(1);
    expect((items[0].before as { role: string }).role).toBe('technician');
    expect((items[0].after as { role: string }).role).toBe('coordinator');
    expect(items[0].reason).toBe('moves to coordination');
  });

  it('a monitor sees only entries of their own study; an admin sees all', async () => {
    const forA = await auditEntries(t, 'monitor', { pageSize: 200 });
    const forB = await auditEntries(t, 'monitorB', { pageSize: 200 });
    const all = await auditEntries(t, 'admin', { pageSize: 200 });
    expect(forA.items.every((e) => e.studyId === t.seed.studies.A.id)).toBe(true);
    expect(forB.items.every((e) => e.studyId === t.seed.studies.B.id)).toBe(true);
    expect(forA.total).toBeGreaterThan(0);
    expect(all.total).toBeGreaterThan(forA.total + forB.total - 1);
  });

  it('filters by actor, action, object type and time range, and paginates', async () => {
    const actor = await auditEntries(t, 'admin', { actorId: t.seed.users.technician.id });
    expect(actor.items.every((e) => e.actorId === t.seed.users.technician.id)).toBe(true);
    const byType = await auditEntries(t, 'admin', { objectType: 'Participant', action: 'create' });
    expect(byType.items.every((e) => e.objectType === 'Participant' && e.action === 'create')).toBe(
      true,
    );
    const future = await auditEntries(t, 'admin', { from: '2999-01-01T00:00:00Z' });
    expect(future.total).toBe(0);
    const past = await auditEntries(t, 'admin', { to: '2000-01-01T00:00:00Z' });
    expect(past.total).toBe(0);
    const page = await auditEntries(t, 'admin', { pageSize: 2, page: 1 });
    expect(page.items).toHaveLength(2);
    const bad = await getAs(t, 'admin', '/api/audit', {
      from: '2026-02-01T00:00:00Z',
      to: '2026-01-01T00:00:00Z',
    });
    expect(bad.status).toBe(400);
    expect(bad.body.message).toMatch(/from/);
    const notIso = await getAs(t, 'admin', '/api/audit', { from: 'yesterday' });
    expect(notIso.status).toBe(400);
  });

  it('exports CSV of the filtered entries, and the export is itself audited', async () => {
    const response = await getAs(t, 'monitor', '/api/audit/export.csv', {
      objectType: 'Participant',
    });
    expect(response.status).toBe(200);
    expect(response.headers['content-type']).toMatch(/^text\/csv/);
    const lines = response.text.trim().split('\r\n');
    expect(lines[0]).toBe(
      'seq,at,actorId,actorEmail,action,objectType,objectId,studyId,siteId,reason,clientIp,before,after,prevHash,hash',
    );
    expect(lines.length).toBeGreaterThan(1);
    expect(lines.slice(1).every((line) => line.split(',')[5] === 'Participant')).toBe(true);
    const { items } = await auditEntries(t, 'monitor', { action: 'export' });
    expect(items[0].actorId).toBe(t.seed.users.monitor.id);
    expect(items[0].objectType).toBe('AuditEntry');
    expect((items[0].after as { filters: { objectType: string } }).filters.objectType).toBe(
      'Participant',
    );
  });

  it('appends stay one chain under concurrent requests', async () => {
    const technician = await t.authHeader('technician');
    const results = await Promise.all(
      Array.from({ length: 12 }, (_, i) =>
        request(t.url)
          .post('/api/participants')
          .set(technician)
          .send({ code: `CC-${String(i).padStart(4, '0')}` }),
      ),
    );
    expect(results.map((r) => r.status)).toEqual(Array(12).fill(201));
    const verify = await getAs(t, 'monitor', '/api/audit/verify');
    expect(verify.body.intact).toBe(true);
    const seqs = (await t.dataSource.query(`SELECT "seq" FROM "audit_entry" ORDER BY "seq"`)) as {
      seq: number;
    }[];
    expect(seqs.map((row) => row.seq)).toEqual(seqs.map((_row, i) => i + 1));
  });

  it('SQLite refuses UPDATE and DELETE on the audit table (trigger)', async () => {
    await expect(
      t.dataSource.query(`UPDATE "audit_entry" SET "reason" = 'edited' WHERE "seq" = 1`),
    ).rejects.toThrow(/append-only: UPDATE refused/);
    await expect(t.dataSource.query(`DELETE FROM "audit_entry" WHERE "seq" = 1`)).rejects.toThrow(
      /append-only: DELETE refused/,
    );
  });

  it('no role can change the trail through the API (no such routes)', async () => {
    for (const method of ['patch', 'delete'] as const) {
      const response = await request(t.url)
        [method]('/api/audit/1')
        .set(await t.authHeader('admin'));
      expect(response.status).toBe(404);
    }
  });

  it('verify names the first altered entry once the trigger is dropped and a row changed', async () => {
    const before = await getAs(t, 'admin', '/api/audit/verify');
    expect(before.body).toMatchObject({ intact: true, firstBroken: null });
    const total = before.body.checked as number;
    const victim = Math.floor(total / 2);
    await t.dataSource.query(`DROP TRIGGER "audit_entry_no_update"`);
    await t.dataSource.query(
      `UPDATE "audit_entry" SET "reason" = 'quietly edited' WHERE "seq" = ?`,
      [victim],
    );
    const after = await getAs(t, 'monitor', '/api/audit/verify');
    expect(after.body.intact).toBe(false);
    expect(after.body.firstBroken.seq).toBe(victim);
    expect(after.body.firstBroken.reason).toMatch(/altered/);
    expect(after.body.checked).toBe(victim - 1);
  });

  it('verify also finds a deleted entry (sequence gap)', async () => {
    await t.dataSource.query(`DROP TRIGGER "audit_entry_no_delete"`);
    await t.dataSource.query(`DELETE FROM "audit_entry" WHERE "seq" = 2`);
    const after = await getAs(t, 'admin', '/api/audit/verify');
    expect(after.body.intact).toBe(false);
    expect(after.body.firstBroken.seq).toBe(3);
    expect(after.body.firstBroken.reason).toMatch(/missing/);
  });
});
