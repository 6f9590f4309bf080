import { render, screen } from '@testing-library/react';
import { http, HttpResponse } from 'msw';
import { SWRConfig } from 'swr';
import { describe, expect, it } from 'vitest';
// Two features' hooks read one address; the two must not share a cache entry. Only the app,
// which holds both in one SWR cache, may see both.
import { useRecordings } from '../features/intake/api/recordings';
import { page, recording } from '../features/intake/testing/intake-fixtures';
import { useVisitRecordings } from '../features/review/api/get-visit-recordings';
import { setAccessToken } from '../lib/api-client';
import { installMswServer, server } from '../test/msw-server';

installMswServer();

function BothShapes() {
  const intake = useRecordings('v-1');
  const review = useVisitRecordings('v-1');
  return (
    <>
      <p>intake {intake.data === undefined ? 'loading' : `page of ${intake.data.total}`}</p>
      <p>
        review{' '}
        {review.data === undefined
          ? 'loading'
          : `array of ${review.data.filter((r) => r.state === 'ready').length}`}
      </p>
    </>
  );
}

describe('recording list keys', () => {
  it('keeps the page (Intake) and the array (Review) of one visit apart in one SWR cache', async () => {
    setAccessToken('test-access-token');
    server.use(
      http.get('/api/recordings', () =>
        HttpResponse.json(page([recording({ id: 'a' }), recording({ id: 'b' })])),
      ),
    );
    render(
      <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
        <BothShapes />
      </SWRConfig>,
    );
    // With one key, one of them would get the other's shape (`recordings?.some is not a function`).
    expect(await screen.findByText('intake page of 2')).toBeInTheDocument();
    expect(await screen.findByText('review array of 2')).toBeInTheDocument();
  });
});
