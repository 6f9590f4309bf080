import { defineAbilityFor } from '@gyre/shared';
import { AuditContextReads } from '../src/audit/audit-context.reads';
import { SqliteReadsService } from '../src/common/database/sqlite-reads.service';
import { auditEntries } from './helpers/audit-entries';
import { useTestApp } from './helpers/test-app';
import { getAs, postAs } from './helpers/api-call';
import { newVisit } from './helpers/new-visit';

/**
 * The Ledger as a monitor reads it: each entry's participant code, visit label and people's
 * names resolved by the server (under the reader's scope), and the participant filter. The
 * expected names are the seeded rows' own values (test/helpers/seed.ts), not the server's.
 */
describe('audit trail for readers (names, links, participant filter)', () => {
  const t = useTestApp();
  let secondVisitId: string;
  let flagId: string;
  let invitedId: string;
  beforeAll(async () => {
    // Technician at A1: a second visit of participant A1-0001.
    secondVisitId = await newVisit(t, 'V2', '2026-03-01');
    // Technician at A2: a visit of A2-0001 (another participant of the same study).
    await newVisit(t, 'V2', '2026-03-02', 'A2');
    // Analyst: a slowing flag on A1-0001's first visit.
    const raised = await postAs(t, 'analyst', `/api/visits/${t.seed.visits.A1.id}/flag/raise`, {
      reason: 'ROI slowing seen in the spectrum',
    });
    expect(raised.status).toBe(201);
    // Admin (no study): invites a technician into study A.
    const invited = await postAs(t, 'admin', '/api/users/invitations', {
      email: 'ledger-new@gyre.test',
      name: 'Ledger Newcomer',
      role: 'technician',
      studyId: t.seed.studies.A.id,
      siteId: t.seed.sites.A1.id,
    });
    expect(invited.status).toBe(201);
    invitedId = invited.body.id as string;
  });

  it('names the participant, visit and actor of a flag entry for a monitor of the study', async () => {
    const { items } = await auditEntries(t, 'monitor', { objectType: 'Flag', action: 'raise' });
    expect(items).toHaveLength(1);
    const [flag] = items;
    flagId = flag.objectId as string;
    expect(flag.context).toEqual({
      actorName: 'Seeded analyst',
      participantId: t.seed.participants.A1.id,
      participantCode: 'A1-0001',
      visitId: t.seed.visits.A1.id,
      visitLabel: t.seed.visits.A1.label,
      recordingKind: null,
      // raisedById in the recorded "after" is the analyst.
      people: { [t.seed.users.analyst.id]: 'Seeded analyst' },
    });
    // The recorded columns are untouched: the context is beside them, not in the hash.
    expect(flag.actorEmail).toBe(t.seed.users.analyst.email);
  });

  it('names the visit and its participant for a visit entry', async () => {
    const { items } = await auditEntries(t, 'monitor', {
      objectType: 'Visit',
      objectId: secondVisitId,
    });
    expect(items).toHaveLength(1);
    expect(items[0].context).toMatchObject({
      actorName: 'Seeded technician',
      participantId: t.seed.participants.A1.id,
      participantCode: 'A1-0001',
      visitId: secondVisitId,
      visitLabel: 'V2',
    });
  });

  it("does not name an actor out of the monitor's scope; an admin sees the name", async () => {
    const monitorView = await auditEntries(t, 'monitor', {
      objectType: 'User',
      objectId: invitedId,
    });
    expect(monitorView.items).toHaveLength(1);
    const [invite] = monitorView.items;
    expect(invite.action).toBe('invite');
    // The admin has no study: a monitor may not read that account (shared/permissions.ts).
    expect(invite.context?.actorName).toBeNull();
    // The invited user belongs to study A: the monitor may read that name.
    expect(invite.context?.people).toEqual({ [invitedId]: 'Ledger Newcomer' });
    const adminView = await auditEntries(t, 'admin', { objectType: 'User', objectId: invitedId });
    expect(adminView.items[0].context?.actorName).toBe('Seeded admin');
  });

  it('gives an admin no participant code or visit label (admins do not read participants)', async () => {
    const { items } = await auditEntries(t, 'admin', { objectType: 'Flag', objectId: flagId });
    expect(items).toHaveLength(1);
    expect(items[0].context).toMatchObject({
      actorName: 'Seeded analyst',
      participantId: null,
      participantCode: null,
      visitId: null,
      visitLabel: null,
    });
  });

  it('filters by participant: its visits and the flag on its visit, nothing of another participant', async () => {
    const { items, total } = await auditEntries(t, 'monitor', {
      participantId: t.seed.participants.A1.id,
      order: 'asc',
    });
    // Written in beforeAll about A1-0001: the V2 visit and the flag on V1 (seed writes no entries).
    expect(total).toBe(2);
    expect(items.map((e) => [e.objectType, e.action])).toEqual([
      ['Visit', 'create'],
      ['Flag', 'raise'],
    ]);
    expect(items.every((e) => e.context?.participantCode === 'A1-0001')).toBe(true);

    const a2 = await auditEntries(t, 'monitor', { participantId: t.seed.participants.A2.id });
    expect(a2.total).toBe(1);
    expect(a2.items[0].context?.participantCode).toBe('A2-0001');

    // Combined with another filter, the participant filter narrows it.
    const flagsOnly = await auditEntries(t, 'monitor', {
      participantId: t.seed.participants.A1.id,
      objectType: 'Flag',
    });
    expect(flagsOnly.items.map((e) => e.objectId)).toEqual([flagId]);
  });

  it('a monitor of another study gets nothing about a participant outside it', async () => {
    const outside = await auditEntries(t, 'monitorB', { participantId: t.seed.participants.A1.id });
    expect(outside.total).toBe(0);
    expect(outside.items).toEqual([]);
    // Nor does the unfiltered page of study B name anything of study A.
    const page = await auditEntries(t, 'monitorB', { pageSize: 100 });
    const named = page.items.flatMap((e) => [
      e.context?.participantCode,
      e.context?.visitLabel,
      ...Object.values(e.context?.people ?? {}),
    ]);
    expect(named).not.toContain('A1-0001');
    expect(named).not.toContain('Ledger Newcomer');
  });

  it('resolves a page in a fixed number of reads, however many entries it has', async () => {
    const { items } = await auditEntries(t, 'admin', { pageSize: 100 });
    expect(new Set(items.map((e) => e.objectType)).size).toBeGreaterThanOrEqual(3);
    const contexts = t.app.get(AuditContextReads);
    const reads = t.app.get(SqliteReadsService);
    const ability = defineAbilityFor(t.seed.users.monitor);
    const spy = jest.spyOn(reads, 'all');
    try {
      contexts.contextsFor(ability, items.slice(0, 1));
      const forOne = spy.mock.calls.length;
      spy.mockClear();
      contexts.contextsFor(ability, items);
      // Links, visits, participants, users: at most four reads for any page.
      expect(spy.mock.calls.length).toBeLessThanOrEqual(4);
      expect(forOne).toBeLessThanOrEqual(4);
    } finally {
      spy.mockRestore();
    }
  });

  it('the CSV export honours the participant filter and keeps its raw columns', async () => {
    const response = await getAs(t, 'monitor', '/api/audit/export.csv', {
      participantId: t.seed.participants.A1.id,
    });
    expect(response.status).toBe(200);
    const lines = response.text.trim().split('\r\n');
    expect(lines[0].startsWith('seq,at,actorId,actorEmail,action,objectType,objectId')).toBe(true);
    expect(lines).toHaveLength(3);
    expect(lines[2]).toContain(flagId);
  });

  it('refuses a participant filter that is not a string of at most 64 characters (400)', async () => {
    const response = await getAs(t, 'monitor', '/api/audit', { participantId: 'x'.repeat(65) });
    expect(response.status).toBe(400);
    expect(JSON.stringify(response.body)).toContain('participantId');
  });
});
