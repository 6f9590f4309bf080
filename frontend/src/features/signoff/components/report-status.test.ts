import type { ReportRevisionView, ReportSignOffView } from '@gyre/shared';
import { SIGNATURE_MEANING } from '@gyre/shared';
import { describe, expect, it } from 'vitest';
import { reportStatusOf } from './report-status';

// Generated test data: a report with up to two signed revisions.
const revision = (n: number, state: ReportRevisionView['state']): ReportRevisionView =>
  ({ id: `rev-${n}`, revision: n, state }) as ReportRevisionView;

const signOff = (
  pendingRevision: number | null,
  revisions: ReportRevisionView[],
  state: ReportSignOffView['report']['state'],
): ReportSignOffView => ({
  report: {
    id: 'report-1',
    visitId: 'visit-1',
    participantId: 'p-1',
    siteId: 'site-1',
    state,
    createdAt: '2025-03-01T09:00:00.000Z',
    updatedAt: '2025-03-01T09:00:00.000Z',
  },
  meaning: SIGNATURE_MEANING,
  draftFingerprint: pendingRevision === null ? null : 'f'.repeat(64),
  pendingRevision,
  canSign: pendingRevision !== null,
  cannotSignReason: pendingRevision === null ? 'Nothing changed.' : null,
  revisions,
});

describe('the report state in words (one function for the chip and the card)', () => {
  it('names a draft nobody has signed', () => {
    expect(reportStatusOf(signOff(1, [], 'draft')).words).toBe('Draft, not signed yet');
    expect(reportStatusOf(signOff(null, [], 'draft')).words).toBe('Draft, nothing to sign yet');
  });

  it('names the signed and the sent revision', () => {
    expect(reportStatusOf(signOff(null, [revision(1, 'signed')], 'signed')).words).toBe(
      'Revision 1 signed, not yet sent',
    );
    expect(reportStatusOf(signOff(null, [revision(1, 'sent')], 'sent')).words).toBe(
      'Revision 1 sent to coordinators',
    );
  });

  it('says a newer draft awaits signing even while the stored report state is still "sent"', () => {
    // The case: the header said "Report: sent" while the card said revision 2 awaits.
    const status = reportStatusOf(signOff(2, [revision(1, 'sent')], 'sent'));
    expect(status.words).toBe('Revision 2 awaits signing (revision 1 sent)');
    expect(status.words).not.toMatch(/^Report: sent/);
    expect(
      reportStatusOf(signOff(3, [revision(2, 'signed'), revision(1, 'sent')], 'signed')).words,
    ).toBe('Revision 3 awaits signing (revision 2 signed)');
  });
});
