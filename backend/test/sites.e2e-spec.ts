/**
 * Site writes through the real API: each create, change and removal commits with its audit
 * entry or not at all (the audited save of src/audit/audited-writes.ts), a clash of codes is the
 * module's own 409, and a site still in use stays with nothing written.
 */
import request from 'supertest';
import type { AuditEntryView, SiteView } from '@gyre/shared';
import { auditEntries } from './helpers/audit-entries';
import { countOf } from './helpers/row-count';
import { useTestApp } from './helpers/test-app';

describe('sites', () => {
  const t = useTestApp();
  let admin: { Authorization: string };

  beforeAll(async () => {
    admin = await t.authHeader('admin');
  });

  const siteEntries = async (objectId: string): Promise<AuditEntryView[]> =>
    (await auditEntries(t, 'admin', { objectId, pageSize: 100 })).items.filter(
      (entry) => entry.objectType === 'Site',
    );

  it('create, rename and remove: one audit entry each, in the study and the site', async () => {
    const created = await request(t.url)
      .post('/api/sites')
      .set(admin)
      .send({ studyId: t.seed.studies.A.id, code: 'WEST', name: ' West wing ' });
    expect(created.status).toBe(201);
    const site = created.body as SiteView;
    expect(site).toMatchObject({ code: 'WEST', name: 'West wing' });

    const renamed = await request(t.url)
      .patch(`/api/sites/${site.id}`)
      .set(admin)
      .send({ name: 'West building' });
    expect(renamed.status).toBe(200);

    const removed = await request(t.url)
      .delete(`/api/sites/${site.id}`)
      .query({ reason: 'opened by mistake' })
      .set(admin);
    expect(removed.status).toBe(204);

    const entries = await siteEntries(site.id);
    expect(entries.map((e) => e.action).sort()).toEqual(['create', 'delete', 'update']);
    for (const entry of entries) {
      expect(entry).toMatchObject({ studyId: t.seed.studies.A.id, siteId: site.id });
    }
    const update = entries.find((e) => e.action === 'update');
    expect(update?.before).toMatchObject({ name: 'West wing' });
    expect(update?.after).toMatchObject({ name: 'West building' });
    const deletion = entries.find((e) => e.action === 'delete');
    expect(deletion).toMatchObject({ reason: 'opened by mistake', after: null });
    expect(deletion?.before).toMatchObject({ code: 'WEST', name: 'West building' });
  });

  it('a code the study already has: 409 SITE_CODE_TAKEN naming it, nothing written', async () => {
    const sites = await countOf(t, 'site');
    const entries = await countOf(t, 'audit_entry');
    const res = await request(t.url)
      .post('/api/sites')
      .set(admin)
      .send({ studyId: t.seed.studies.A.id, code: t.seed.sites.A1.code, name: 'Twin' });
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({
      code: 'SITE_CODE_TAKEN',
      details: { field: 'code', value: t.seed.sites.A1.code },
    });
    expect(await countOf(t, 'site')).toBe(sites);
    expect(await countOf(t, 'audit_entry')).toBe(entries);
  });

  it('a site with participants and users stays: 409 SITE_IN_USE, nothing written', async () => {
    const entries = await countOf(t, 'audit_entry');
    const res = await request(t.url).delete(`/api/sites/${t.seed.sites.A1.id}`).set(admin);
    expect(res.status).toBe(409);
    expect(res.body.code).toBe('SITE_IN_USE');
    expect(res.body.details.participants).toBeGreaterThan(0);
    expect(await countOf(t, 'audit_entry')).toBe(entries);
    const still = await request(t.url).get(`/api/sites/${t.seed.sites.A1.id}`).set(admin);
    expect(still.status).toBe(200);
  });
});
