import type { AuditEntryContext, AuditEntryView } from '@gyre/shared';
import { describe, expect, it } from 'vitest';
import { entrySentence, sentenceText } from './entry-sentence';

const NBSP = '\u00a0';
const context: AuditEntryContext = {
  actorName: 'Ana Lyst',
  participantId: 'p-1',
  participantCode: 'A1-0001',
  visitId: 'v-1',
  visitLabel: 'V2',
  recordingKind: null,
  people: {},
};

// Generated test data shaped like GET /api/audit's entries.
function entry(change: Partial<AuditEntryView>): AuditEntryView {
  return {
    seq: 7,
    at: '2026-12-02T13:03:12.000Z',
    actorId: 'u-analyst',
    actorEmail: 'analyst@example.org',
    action: 'update',
    objectType: 'Visit',
    objectId: 'x-1',
    studyId: 's-1',
    siteId: 'site-1',
    before: null,
    after: null,
    reason: null,
    clientIp: null,
    prevHash: '0'.repeat(64),
    hash: 'f'.repeat(64),
    context,
    ...change,
  };
}
const everywhere = () => true;

describe('entrySentence', () => {
  it('reads a flag as a sentence with the participant, visit, reason and a Review link', () => {
    const sentence = entrySentence(
      entry({ action: 'raise', objectType: 'Flag', reason: 'ROI slowing in two visits' }),
      everywhere,
    );
    expect(sentenceText(sentence)).toBe(
      'Ana Lyst raised a slowing flag on A1-0001 · V2: ROI slowing in two visits',
    );
    expect(sentence.target).toEqual({ label: 'A1-0001 · V2', to: '/review/v-1' });
  });

  it('reads an unblinding with the code, the visit, the decision and its reason', () => {
    const sentence = entrySentence(
      entry({
        action: 'unblind',
        objectType: 'Visit',
        after: { code: 'B-7KQ2', blinded: false, decision: 'noFlag', flagId: null },
        reason: 'PAF steady, nothing to flag',
      }),
      everywhere,
    );
    expect(sentenceText(sentence)).toBe(
      'Ana Lyst unblinded visit B-7KQ2 (A1-0001 · V2): for themselves after recording the decision, no flag: PAF steady, nothing to flag',
    );
    expect(sentence.target?.to).toBe('/review/v-1');
  });

  it("reads a calibration run's start and outcome with the site, linked to Site check", () => {
    const start = entrySentence(
      entry({ action: 'start', objectType: 'Calibration', after: { siteCode: 'NORTH' } }),
      everywhere,
    );
    expect(sentenceText(start)).toBe('Ana Lyst started a calibration run of site NORTH');
    expect(start.target).toEqual({ label: 'site NORTH', to: '/site-check' });
    const failed = entrySentence(
      entry({
        action: 'fail',
        objectType: 'Calibration',
        actorId: null,
        actorEmail: null,
        after: { siteCode: 'NORTH', error: 'The computation failed: stored file changed' },
      }),
      everywhere,
    );
    expect(sentenceText(failed)).toBe(
      'The system found the calibration run failed for site NORTH: The computation failed: stored file changed',
    );
  });

  it('does not link where the viewer may not go', () => {
    const sentence = entrySentence(entry({ action: 'raise', objectType: 'Flag' }), () => false);
    expect(sentence.target?.to).toBeNull();
  });

  it('names the revision of a signature, the kind of a recording and the system as actor', () => {
    expect(
      sentenceText(
        entrySentence(
          entry({ action: 'sign', objectType: 'Report', after: { revision: { revision: 2 } } }),
          everywhere,
        ),
      ),
    ).toBe('Ana Lyst signed report revision 2 for A1-0001 · V2');
    expect(
      sentenceText(
        entrySentence(
          entry({ action: 'upload', objectType: 'Recording', after: { kind: 'resting' } }),
          everywhere,
        ),
      ),
    ).toBe('Ana Lyst uploaded a resting recording for A1-0001 · V2');
    const computed = entrySentence(
      entry({
        action: 'ready',
        objectType: 'Recording',
        actorId: null,
        actorEmail: null,
        context: { ...context, actorName: null, recordingKind: 'task' },
      }),
      everywhere,
    );
    expect(sentenceText(computed)).toBe('The system computed the task recording for A1-0001 · V2');
    expect(computed.bySystem).toBe(true);
  });

  it('says which analysis setting changed, with units, and links to Study settings', () => {
    const sentence = entrySentence(
      entry({
        objectType: 'AnalysisSettings',
        before: { version: 1, bandHz: [8, 13] },
        after: { version: 2, bandHz: [7, 13] },
        reason: 'Older cohort',
        context: { ...context, participantId: null, participantCode: null, visitId: null },
      }),
      everywhere,
    );
    expect(sentenceText(sentence)).toBe(
      `Ana Lyst changed the analysis settings: Band 8.00–13.00${NBSP}Hz → 7.00–13.00${NBSP}Hz`,
    );
    expect(sentence.target?.to).toBe('/study-settings');
  });

  it('falls back to the recorded e-mail for an actor out of scope, and to plain words for an unknown action', () => {
    const outOfScope = entrySentence(
      entry({ action: 'invite', objectType: 'User', context: { ...context, actorName: null } }),
      everywhere,
    );
    expect(sentenceText(outOfScope)).toBe(
      'analyst@example.org invited an account outside your access',
    );
    expect(
      sentenceText(entrySentence(entry({ action: 'archive', objectType: 'Flag' }), everywhere)),
    ).toBe('Ana Lyst recorded “archive” on a flag of A1-0001 · V2');
  });

  // Every (object type, action) the server records: grep `audit.record(` in backend/src.
  const RECORDED: [string, string[]][] = [
    ['Session', ['sign-in', 'sign-in-failed', 'sign-out', 'refresh-reuse', 'sign-in-throttled']],
    [
      'User',
      [
        'sign-in-throttled',
        'invite',
        'role-change',
        'update',
        'create',
        'password-change',
        'password-reset-request',
        'password-reset',
        'invitation-accepted',
        'account-locked',
      ],
    ],
    ['WorkerToken', ['create', 'revoke']],
    [
      'Recording',
      [
        'upload',
        'validate',
        'accept',
        'reject',
        'compute',
        'ready',
        'attempt-failed',
        'fail',
        'supersede',
        'rerun',
        'retry',
        'recompute',
        'download',
      ],
    ],
    ['Participant', ['create', 'update']],
    ['Report', ['create', 'notify', 'sent', 'sign-refused', 'preview', 'sign', 'download']],
    ['AuditEntry', ['export']],
    ['Site', ['create', 'update', 'delete']],
    ['Study', ['create', 'update', 'bulk-upload', 'export']],
    ['StudyGroup', ['create', 'update', 'delete']],
    ['PlannedVisit', ['create', 'update', 'delete']],
    ['Flag', ['raise', 'clear']],
    ['Visit', ['create', 'update']],
    ['AnalysisSettings', ['update']],
    ['VisitAnalysisOverride', ['update']],
    ['VisitReview', ['review']],
  ];
  it.each(RECORDED)('has words for every action recorded on %s', (objectType, actions) => {
    for (const action of actions) {
      const text = sentenceText(entrySentence(entry({ objectType, action }), everywhere));
      expect(text, `${objectType} ${action}`).not.toContain('recorded “');
      expect(text.startsWith('Ana Lyst ')).toBe(true);
    }
  });
});
