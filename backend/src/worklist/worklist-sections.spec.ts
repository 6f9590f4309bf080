import type { VisitReviewView } from '@gyre/shared';
import type { Flag } from '../flags/flag.entity';
import { blindedClock } from '../blinding/blinded-visit-facts';
import { reviewFingerprintOf } from '../visit-reviews/review-fingerprint';
import {
  reviewSections,
  shownItem,
  signedHz,
  sortItems,
  uploadSections,
} from './worklist-sections';
import type { CurrentRecordingRow, UploadRow, VisitFacts } from './worklist-sources';

// Generated rows: the expectations follow the rules written in the issue ("visits whose
// results changed since signing", "suggestions with no decision yet", "a changed result puts
// it back on the list").

const facts = (n: number): VisitFacts => ({
  visitId: `v${n}`,
  visitLabel: 'V1',
  visitDate: '2026-01-15',
  participantId: `p${n}`,
  participantCode: `GY-${n}`,
  siteId: 's1',
  schedule: {
    plannedVisitId: null,
    plannedVisitName: null,
    studyDay: null,
    targetDay: null,
    daysFromTarget: null,
    window: 'unplanned',
  },
});

function rec(n: number, kind: 'resting' | 'task', extra: Partial<CurrentRecordingRow> = {}) {
  return {
    ...facts(n),
    recordingId: `r${n}${kind}`,
    kind,
    state: 'ready',
    latestRunId: `run${n}${kind}`,
    updatedAt: '2026-02-01T10:00:00.000Z',
    failureMessage: null,
    runCreatedAt: '2026-02-01T10:00:00.000Z',
    suggestsSlowing: false,
    roiDeltaFHz: kind === 'task' ? -0.1 : null,
    ...extra,
  } satisfies CurrentRecordingRow;
}

function reviewOf(rows: CurrentRecordingRow[], at = '2026-02-02T00:00:00.000Z'): VisitReviewView {
  const now = reviewFingerprintOf(rows)!;
  return {
    id: 'rv',
    visitId: rows[0].visitId,
    reviewedById: 'u1',
    reviewedByName: 'Ana Lyst',
    reviewedAt: at,
    ...now,
  };
}

function flag(visitId: string, extra: Partial<Flag>): Flag {
  return {
    id: 'f',
    visitId,
    participantId: 'p',
    studyId: 'st',
    siteId: 's1',
    state: 'cleared',
    raisedById: 'u1',
    raiseReason: 'reason given',
    raisedAt: '2026-01-01T00:00:00.000Z',
    suggestionJson: null,
    clearedById: 'u1',
    clearReason: 'reason given',
    clearedAt: '2026-01-02T00:00:00.000Z',
    ...extra,
  };
}

const keys = (items: { visitId: string }[] | undefined) => (items ?? []).map((i) => i.visitId);

describe('review sections', () => {
  it('a review holds for exactly the runs it covered', () => {
    const v1 = [rec(1, 'resting'), rec(1, 'task')];
    const v2 = [rec(2, 'resting'), rec(2, 'task')];
    const reviews = new Map([
      ['v1', reviewOf(v1)],
      // v2 was reviewed when its task had another run.
      ['v2', reviewOf([v2[0], { ...v2[1], latestRunId: 'older' }])],
    ]);
    const out = reviewSections({ recordings: [...v1, ...v2], reports: [], reviews, flags: [] });
    expect(keys(out.unreviewed)).toEqual(['v2']);
    expect(out.unreviewed?.[0].what).toBe(
      'Results changed since Ana Lyst reviewed them on 2026-02-02',
    );
  });

  it('a suggestion waits for a decision: a raised flag, one cleared since the run, or a review', () => {
    const suggesting = (n: number) => [
      rec(n, 'resting'),
      rec(n, 'task', { suggestsSlowing: true, roiDeltaFHz: -0.456 }),
    ];
    const rows = [1, 2, 3, 4, 5].flatMap(suggesting);
    const out = reviewSections({
      recordings: rows,
      reports: [],
      reviews: new Map([['v4', reviewOf(suggesting(4))]]),
      flags: [
        flag('v1', { state: 'raised', clearedAt: null }),
        // Cleared before the suggesting run was computed: no decision on this run.
        flag('v2', { clearedAt: '2026-01-31T00:00:00.000Z' }),
        flag('v3', { clearedAt: '2026-02-01T11:00:00.000Z' }),
      ],
    });
    expect(keys(out.suggestions)).toEqual(['v2', 'v5']);
    // −0.456 Hz to two decimals with a true minus sign.
    expect(out.suggestions?.[0].what).toBe(
      'The task result suggests slowing (ROI Δf −0.46\u00a0Hz); no flag decision yet',
    );
  });

  it('lists drafts with results, and signed reports only when a run is newer than the signature', () => {
    const rows = [1, 2, 3].flatMap((n) => [rec(n, 'task')]);
    const out = reviewSections({
      recordings: rows,
      reports: [
        {
          visitId: 'v1',
          state: 'draft',
          createdAt: '2026-02-01T10:00:01.000Z',
          lastSignedAt: null,
          lastRevision: null,
        },
        {
          visitId: 'v2',
          state: 'signed',
          createdAt: 'x',
          lastSignedAt: '2026-02-01T09:00:00.000Z',
          lastRevision: 1,
        },
        {
          visitId: 'v3',
          state: 'sent',
          createdAt: 'x',
          lastSignedAt: '2026-02-01T12:00:00.000Z',
          lastRevision: 2,
        },
        // A draft of a visit without current results (e.g. replaced, not yet computed).
        { visitId: 'v9', state: 'draft', createdAt: 'x', lastSignedAt: null, lastRevision: null },
      ],
      reviews: new Map(),
      flags: [],
    });
    expect(keys(out.awaitingSignature)).toEqual(['v1']);
    expect(keys(out.changedSinceSigning)).toEqual(['v2']);
    expect(out.changedSinceSigning?.[0].what).toBe(
      'New results since revision 1 was signed on 2026-02-01',
    );
  });

  it('lists failed computations with their message', () => {
    const out = reviewSections({
      recordings: [rec(1, 'task', { state: 'failed', failureMessage: 'worker stopped' })],
      reports: [],
      reviews: new Map(),
      flags: [],
    });
    expect(out.failed?.map((i) => i.what)).toEqual([
      'Computing the task recording failed: worker stopped',
    ]);
  });
});

describe('upload sections', () => {
  const upload = (n: number, kind: 'resting' | 'task', extra: Partial<UploadRow>): UploadRow => ({
    ...facts(n),
    recordingId: `r${n}${kind}${extra.createdAt ?? ''}`,
    kind,
    state: 'ready',
    createdAt: '2026-02-01T10:00:00.000Z',
    updatedAt: '2026-02-01T10:00:00.000Z',
    failureMessage: null,
    rejection: null,
    hasWarnings: false,
    ...extra,
  });

  it('drops a rejection once a later upload of that kind came in, and names missing kinds', () => {
    const out = uploadSections({
      uploads: [
        upload(1, 'task', { state: 'rejected', rejection: 'bad header' }),
        upload(1, 'task', { state: 'validating', createdAt: '2026-02-01T11:00:00.000Z' }),
        upload(1, 'resting', {}),
        upload(2, 'task', { state: 'rejected', rejection: 'bad header' }),
      ],
      visitsDue: [facts(1), facts(2), facts(3)],
      warnings: new Map(),
    });
    expect(out.rejected?.map((i) => [i.visitId, i.what])).toEqual([
      ['v2', 'The task upload was rejected: bad header'],
    ]);
    expect(out.missingKinds?.map((i) => [i.visitId, i.what])).toEqual([
      ['v2', 'No resting and no task recording yet'],
      ['v3', 'No resting and no task recording yet'],
    ]);
  });

  it("words warnings as the recording's view does", () => {
    const out = uploadSections({
      uploads: [upload(1, 'task', { hasWarnings: true })],
      visitsDue: [],
      warnings: new Map([['r1task', ['first warning', 'second warning']]]),
    });
    expect(out.warnings?.map((i) => i.what)).toEqual([
      'Task recording: first warning (and 1 more)',
    ]);
  });
});

describe('sorting and wording', () => {
  it('sorts oldest first, newest first, or by participant code', () => {
    const items = [3, 1, 2].map((n) => ({
      ...reviewSections({
        recordings: [rec(n, 'task', { runCreatedAt: `2026-02-0${4 - n}T00:00:00.000Z` })],
        reports: [],
        reviews: new Map(),
        flags: [],
      }).unreviewed![0],
    }));
    expect(sortItems(items, 'oldest').map((i) => i.visitId)).toEqual(['v3', 'v2', 'v1']);
    expect(sortItems(items, 'newest').map((i) => i.visitId)).toEqual(['v1', 'v2', 'v3']);
    expect(sortItems(items, 'participant').map((i) => i.visitId)).toEqual(['v1', 'v2', 'v3']);
  });

  it('shows a blinded visit under its code only, sorted after the others by participant', () => {
    const items = [3, 1, 2].map(
      (n) =>
        reviewSections({
          recordings: [rec(n, 'resting')],
          reports: [],
          reviews: new Map(),
          flags: [],
        }).unreviewed![0],
    );
    const codes = new Map([['v1', { code: 'B-7KQ2', clock: blindedClock(items[1].since) }]]);
    const shown = items.map((i) => shownItem(i, codes));
    const blinded = shown.find((i) => i.visitId === 'v1');
    expect(blinded).toMatchObject({
      blindCode: 'B-7KQ2',
      visitLabel: 'B-7KQ2',
      visitDate: null,
      schedule: null,
      participantId: null,
      participantCode: null,
      link: { screen: 'review', visitId: 'v1', participantId: null },
    });
    // Its waiting time is counted from its first upload, not dated (docs/user-guide.md).
    expect(blinded?.since).toMatch(/^1970-01-01T/);
    // Nothing of the visit but its id, its code and what waits is left in the item.
    expect(JSON.stringify(blinded)).not.toMatch(/GY-1|2026-01-15|"p1"/);
    expect(shown.find((i) => i.visitId === 'v2')).toEqual(items.find((i) => i.visitId === 'v2'));
    expect(sortItems(shown, 'participant').map((i) => i.visitId)).toEqual(['v2', 'v3', 'v1']);
  });

  it("leaves a blinded visit's date out, and sorts it after every timed item either way", () => {
    const timed = reviewSections({
      recordings: [rec(2, 'resting')],
      reports: [],
      reviews: new Map(),
      flags: [],
    }).unreviewed![0];
    // An item waiting since the visit's date (a recording not uploaded yet): there may be no
    // upload to count from, and the date itself is what blinding hides.
    const dated = { ...timed, key: 'v1', visitId: 'v1', since: '2026-01-15' };
    const codes = new Map([['v1', { code: 'B-7KQ2', clock: blindedClock(null) }]]);
    const shown = [dated, timed].map((i) => shownItem(i, codes));
    expect(shown[0].since).toBeNull();
    expect(JSON.stringify(shown[0])).not.toContain('2026-01-15');
    expect(sortItems(shown, 'oldest').map((i) => i.visitId)).toEqual(['v2', 'v1']);
    expect(sortItems(shown, 'newest').map((i) => i.visitId)).toEqual(['v2', 'v1']);
  });

  it('writes Hz with a true minus sign, and no sign for what rounds to zero', () => {
    expect([signedHz(-0.456), signedHz(0.2), signedHz(-0.001), signedHz(0.004)]).toEqual([
      '−0.46\u00a0Hz',
      '+0.20\u00a0Hz',
      '0.00\u00a0Hz',
      '0.00\u00a0Hz',
    ]);
  });
});
