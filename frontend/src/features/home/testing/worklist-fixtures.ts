import type { WorklistView, WorklistItem, WorklistSection } from '@gyre/shared';
import { SITE } from '../../../test/fixtures';

// Generated test data: invented participants and visits.

export function worklistItem(n: number, extra: Partial<WorklistItem> = {}): WorklistItem {
  const code = `GY-${String(n).padStart(4, '0')}`;
  return {
    key: `visit-${n}`,
    participantId: `p-${n}`,
    participantCode: code,
    visitId: `visit-${n}`,
    visitLabel: 'Month 6',
    visitDate: '2025-02-03',
    schedule: {
      plannedVisitId: 'pv-month-6',
      plannedVisitName: 'Month 6',
      // Month 6 (target day 182, ±7 days): odd visits on day 190 (late by 8), even on day 184.
      studyDay: n % 2 === 1 ? 190 : 184,
      targetDay: 182,
      daysFromTarget: n % 2 === 1 ? 8 : 2,
      window: n % 2 === 1 ? 'late' : 'in',
    },
    blindCode: null,
    siteId: SITE.id,
    kind: null,
    recordingId: null,
    what: 'Results of the resting and the task recording not reviewed yet',
    since: `2025-02-${String(3 + (n % 20)).padStart(2, '0')}T09:00:00.000Z`,
    link: { screen: 'review', participantId: `p-${n}`, visitId: `visit-${n}` },
    ...extra,
  };
}

export function section(
  key: WorklistSection['key'],
  title: string,
  items: WorklistItem[],
  total = items.length,
): WorklistSection {
  return { key, title, total, items };
}

export function reviewWorklist(readOnly: boolean, unreviewedTotal = 2): WorklistView {
  return {
    kind: 'review',
    readOnly,
    sort: 'oldest',
    limit: 8,
    offset: 0,
    generatedAt: '2025-03-01T10:00:00.000Z',
    sections: [
      section(
        'unreviewed',
        'Results not reviewed',
        [1, 2].map((n) => worklistItem(n)),
        unreviewedTotal,
      ),
      section('suggestions', 'Suggestions without a decision', [
        worklistItem(1, {
          kind: 'task',
          what: 'The task result suggests slowing (ROI Δf −0.45 Hz); no flag decision yet',
        }),
      ]),
      section('awaitingSignature', 'Reports waiting for a signature', []),
      section('changedSinceSigning', 'Results changed since signing', []),
      section('failed', 'Failed computations', []),
    ],
  };
}

export const UPLOADS_WORKLIST: WorklistView = {
  kind: 'uploads',
  readOnly: false,
  sort: 'oldest',
  limit: 8,
  offset: 0,
  generatedAt: '2025-03-01T10:00:00.000Z',
  sections: [
    section('rejected', 'Rejected uploads', [
      worklistItem(7, {
        key: 'rec-7',
        kind: 'task',
        recordingId: 'rec-7',
        what: 'The task upload was rejected: not an EDF file',
        link: { screen: 'intake', participantId: 'p-7', visitId: 'visit-7' },
      }),
    ]),
    section('warnings', 'Uploads with warnings', []),
    section('missingKinds', 'Visits missing a recording', []),
    section('failed', 'Failed computations', []),
  ],
};
