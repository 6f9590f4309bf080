import type { Role, WorklistView } from '@gyre/shared';
import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { meFor } from '../../../test/fixtures';
import { installMswServer, server } from '../../../test/msw-server';
import { renderApp } from '../../../test/render-app';
import { reviewWorklist, UPLOADS_WORKLIST, worklistItem } from '../testing/worklist-fixtures';

installMswServer();

/** Answers `GET /api/worklist` with `answer(query)` and records every query asked. */
function serveWorklist(answer: (query: URLSearchParams) => WorklistView) {
  const asked: URLSearchParams[] = [];
  server.use(
    http.get('/api/worklist', ({ request }) => {
      const query = new URL(request.url).searchParams;
      asked.push(query);
      return HttpResponse.json(answer(query));
    }),
  );
  return asked;
}

async function openHome(role: Role) {
  renderApp('/', meFor(role));
  return screen.findByRole('region', { name: 'Worklist' }, { timeout: 15_000 });
}

describe('the home worklist', { timeout: 30_000 }, () => {
  it('shows an analyst each section with its count and links items to Review, with the caution', async () => {
    const asked = serveWorklist(() => reviewWorklist(false));
    const list = await openHome('analyst');
    const unreviewed = await within(list).findByRole('generic', { name: 'Results not reviewed' });
    expect(within(unreviewed).getByLabelText('2 items')).toBeInTheDocument();
    const link = within(unreviewed).getByRole('link', { name: 'GY-0001 · Month 6' });
    expect(link).toHaveAttribute('href', '/review/visit-1');
    // Each item carries its visit's window status: day 190 against target 182 ± 7 is late by 8.
    const [first, second] = within(unreviewed).getAllByRole('listitem');
    expect(within(first).getByLabelText('Schedule: Late by 8 days')).toBeInTheDocument();
    expect(within(second).getByLabelText('Schedule: In window')).toBeInTheDocument();
    expect(
      within(list).getByText(
        'The task result suggests slowing (ROI Δf −0.45 Hz); no flag decision yet',
      ),
    ).toBeInTheDocument();
    expect(within(list).getAllByText('Nothing waits here.')).toHaveLength(3);
    expect(screen.getByRole('note', { name: 'Research use caution' })).toBeInTheDocument();
    expect(screen.getByText('What waits for you in the study. Open an item to review it.'));
    expect(asked[0].get('sort')).toBe('oldest');
  });

  it('asks the server again in the order chosen', async () => {
    const asked = serveWorklist(() => reviewWorklist(false));
    await openHome('analyst');
    await userEvent.click(await screen.findByText('Newest first'));
    await waitFor(() => expect(asked.at(-1)?.get('sort')).toBe('newest'));
  });

  it('pages through a long section, asking for that section alone', async () => {
    const asked = serveWorklist((query) => {
      if (query.get('section') === 'unreviewed') {
        const offset = Number(query.get('offset'));
        return {
          ...reviewWorklist(false, 11),
          offset,
          sections: [
            {
              key: 'unreviewed',
              title: 'Results not reviewed',
              total: 11,
              items: [9, 10, 11].map((n) => worklistItem(n)),
            },
          ],
        };
      }
      return reviewWorklist(false, 11);
    });
    const list = await openHome('analyst');
    const unreviewed = await within(list).findByRole('generic', { name: 'Results not reviewed' });
    await userEvent.click(within(unreviewed).getByTitle('Next Page'));
    expect(await within(unreviewed).findByText('GY-0011 · Month 6')).toBeInTheDocument();
    const paged = asked.find((q) => q.get('section') === 'unreviewed');
    expect(paged?.get('offset')).toBe('8');
    expect(paged?.get('limit')).toBe('8');
  });

  it('shows a blinded visit under its code only, with the blinded-review notice', async () => {
    const blinded = worklistItem(3, {
      participantId: null,
      participantCode: null,
      visitLabel: 'B-7KQ2',
      visitDate: null,
      schedule: null,
      blindCode: 'B-7KQ2',
      link: { screen: 'review', participantId: null, visitId: 'visit-3' },
    });
    serveWorklist(() => {
      const list = reviewWorklist(false);
      const [first, ...rest] = list.sections;
      return { ...list, sections: [{ ...first, total: 1, items: [blinded] }, ...rest] };
    });
    const list = await openHome('analyst');
    const unreviewed = await within(list).findByRole('generic', { name: 'Results not reviewed' });
    const link = within(unreviewed).getByRole('link', { name: 'Visit B-7KQ2' });
    expect(link).toHaveAttribute('href', '/review/visit-3');
    expect(within(unreviewed).getByText('Blinded')).toBeInTheDocument();
    expect(within(unreviewed).queryByText(/GY-0003|Month 6/)).toBeNull();
    const notice = screen.getByRole('note', { name: 'Blinded review' });
    expect(notice).toHaveTextContent(
      'Blinded review: visit details hidden until you record your decision.',
    );
  });

  it('tells a monitor the list is to follow, not to act on', async () => {
    serveWorklist(() => reviewWorklist(true));
    await openHome('monitor');
    expect(
      await screen.findByText(
        'What waits for the analysts in the study. You follow it here; marking visits reviewed is for analysts.',
      ),
    ).toBeInTheDocument();
  });

  it("shows a technician their site's uploads, linked to Intake with the visit chosen", async () => {
    serveWorklist(() => UPLOADS_WORKLIST);
    const list = await openHome('technician');
    expect(
      await within(list).findByRole('heading', { name: 'Uploads that need attention' }),
    ).toBeInTheDocument();
    expect(within(list).getByRole('link', { name: 'GY-0007 · Month 6' })).toHaveAttribute(
      'href',
      '/intake?participant=p-7&visit=visit-7',
    );
    expect(screen.queryByRole('note', { name: 'Research use caution' })).toBeNull();
  });

  it('asks nothing for a coordinator, who has no worklist', async () => {
    const asked = serveWorklist(() => reviewWorklist(false));
    renderApp('/', meFor('coordinator'));
    expect(await screen.findByText(`Welcome, ${meFor('coordinator').user.name}`));
    expect(screen.queryByRole('region', { name: 'Worklist' })).toBeNull();
    expect(asked).toHaveLength(0);
  });
});
