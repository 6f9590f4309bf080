import { AbilityProvider } from '@casl/react';
import type { Role, VisitReviewStateView } from '@gyre/shared';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { ApiError } from '../../../lib/api-client';
import { abilityFromRules } from '../../../lib/session/ability';
import { meFor } from '../../../test/fixtures';
import { NOT_REVIEWED } from '../testing/review-fixtures';
import { ReviewMark } from './review-mark';

const REVIEWED_BY_OTHER: VisitReviewStateView = {
  ...NOT_REVIEWED,
  latest: {
    id: 'review-1',
    visitId: NOT_REVIEWED.visitId,
    reviewedById: 'user-other',
    reviewedByName: 'Ren Viewer',
    reviewedAt: '2025-02-04T09:00:00.000Z',
    fingerprint: NOT_REVIEWED.currentFingerprint ?? '',
    runIds: NOT_REVIEWED.currentRunIds,
  },
  reviewed: true,
  canReview: false,
  cannotReviewReason: 'These results are reviewed; nothing has changed since.',
};

const CHANGED: VisitReviewStateView = {
  ...REVIEWED_BY_OTHER,
  currentFingerprint: '6'.repeat(64),
  currentRunIds: ['resting:run-rest-2', 'task:run-task'],
  reviewed: false,
  changedSinceReview: true,
  canReview: true,
  cannotReviewReason: null,
};

function renderMark(role: Role, state: VisitReviewStateView, onMark = vi.fn(async () => {})) {
  const me = meFor(role);
  render(
    <AbilityProvider value={abilityFromRules(me.rules)}>
      <ReviewMark state={state} meId={me.user.id} onMark={onMark} />
    </AbilityProvider>,
  );
  return onMark;
}

describe('ReviewMark', () => {
  it('lets an analyst mark the results on screen reviewed, sending their fingerprint', async () => {
    const onMark = renderMark('analyst', NOT_REVIEWED);
    expect(screen.getByText('No one has marked this visit reviewed yet.')).toBeInTheDocument();
    await userEvent.click(screen.getByRole('button', { name: 'Mark reviewed' }));
    await waitFor(() => expect(onMark).toHaveBeenCalledWith('5'.repeat(64)));
  });

  it('never offers the action to a monitor, even when the results wait for review', () => {
    renderMark('monitor', CHANGED);
    expect(screen.queryByRole('button', { name: 'Mark reviewed' })).toBeNull();
    expect(screen.getByText('Results changed since review')).toBeInTheDocument();
  });

  it('says who reviewed and when, and offers nothing while nothing has changed', () => {
    renderMark('analyst', REVIEWED_BY_OTHER);
    expect(screen.getByText('Reviewed')).toBeInTheDocument();
    expect(screen.getByText(/by Ren Viewer, 4 Feb 2025/)).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Mark reviewed' })).toBeNull();
  });

  it('calls the reviewer "you" and says when the results changed since', async () => {
    const mine = { ...CHANGED, latest: { ...CHANGED.latest!, reviewedById: 'user-analyst' } };
    renderMark('analyst', mine);
    expect(screen.getByText('Results changed since review')).toBeInTheDocument();
    expect(screen.getByText(/^Reviewed by you, 4 Feb 2025/)).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Mark reviewed' })).toBeEnabled();
  });

  it("shows the server's refusal", async () => {
    renderMark(
      'analyst',
      NOT_REVIEWED,
      vi.fn(async () => {
        throw new ApiError(409, 'VISIT_REVIEW_RESULTS_CHANGED', 'The results have changed.');
      }),
    );
    await userEvent.click(screen.getByRole('button', { name: 'Mark reviewed' }));
    expect(await screen.findByText('The results have changed.')).toBeInTheDocument();
  });

  it('says why a visit without results cannot be reviewed', () => {
    renderMark('analyst', {
      ...NOT_REVIEWED,
      currentFingerprint: null,
      currentRunIds: [],
      canReview: false,
      cannotReviewReason: 'This visit has no results to review yet.',
    });
    expect(screen.getByText('This visit has no results to review yet.')).toBeInTheDocument();
    expect(screen.queryByRole('button', { name: 'Mark reviewed' })).toBeNull();
  });
});
