import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { server, installMswServer } from '../test/msw-server';
import {
  ApiError,
  apiFetch,
  apiFetchOrNull,
  apiSend,
  apiUpload,
  getAccessToken,
  onSessionEnded,
  setAccessToken,
  withQuery,
} from './api-client';
import { errorResponse } from '../test/error-response';

installMswServer();

describe('apiFetch', () => {
  it('turns the API error body into a typed ApiError', async () => {
    server.use(
      http.get('http://localhost:3000/api/visits/7', () =>
        errorResponse(404, 'VISIT_NOT_FOUND', 'Visit 7 not found'),
      ),
    );
    const error = await apiFetch('http://localhost:3000/api/visits/7').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      status: 404,
      code: 'VISIT_NOT_FOUND',
      message: 'Visit 7 not found',
    });
  });

  it('sends the access token and returns the JSON body', async () => {
    let authorization: string | null = null;
    server.use(
      http.get('http://localhost:3000/api/health', ({ request }) => {
        authorization = request.headers.get('authorization');
        return HttpResponse.json({ status: 'ok' });
      }),
    );
    setAccessToken('token-123');
    await expect(apiFetch('http://localhost:3000/api/health')).resolves.toEqual({ status: 'ok' });
    expect(authorization).toBe('Bearer token-123');
    setAccessToken(null);
  });

  it('answers null for a 404 when asked for something that may not exist, and fails otherwise', async () => {
    server.use(
      http.get('http://localhost:3000/api/visits/7/report', () =>
        errorResponse(404, 'REPORT_NOT_FOUND', 'No report'),
      ),
      http.get('http://localhost:3000/api/visits/8/report', () =>
        errorResponse(403, 'FORBIDDEN', 'Not yours'),
      ),
    );
    await expect(apiFetchOrNull('http://localhost:3000/api/visits/7/report')).resolves.toBeNull();
    await expect(apiFetchOrNull('http://localhost:3000/api/visits/8/report')).rejects.toMatchObject(
      { status: 403, code: 'FORBIDDEN' },
    );
  });

  it('reports a non-JSON failure with its status', async () => {
    server.use(
      http.get('http://localhost:3000/api/broken', () => new HttpResponse('oops', { status: 502 })),
    );
    await expect(apiFetch('http://localhost:3000/api/broken')).rejects.toMatchObject({
      status: 502,
      code: 'HTTP_ERROR',
    });
  });
});

describe('silent renewal', () => {
  const refused = () => errorResponse(401, 'AUTH_TOKEN_INVALID', 'Token expired');

  it('renews the token once on a 401 and repeats the request with the new one', async () => {
    const seen: (string | null)[] = [];
    let refreshes = 0;
    server.use(
      http.get('/api/visits', ({ request }) => {
        seen.push(request.headers.get('authorization'));
        return request.headers.get('authorization') === 'Bearer new'
          ? HttpResponse.json([1])
          : refused();
      }),
      http.post('/api/auth/refresh', () => {
        refreshes += 1;
        return HttpResponse.json({ accessToken: 'new', tokenType: 'Bearer', expiresInS: 900 });
      }),
    );
    setAccessToken('old');
    await expect(apiFetch('/api/visits')).resolves.toEqual([1]);
    expect(seen).toEqual(['Bearer old', 'Bearer new']);
    expect(refreshes).toBe(1);
    setAccessToken(null);
  });

  it('shares one renewal between requests refused at the same time', async () => {
    let refreshes = 0;
    server.use(
      http.get('/api/a', ({ request }) =>
        request.headers.get('authorization') === 'Bearer new' ? HttpResponse.json('a') : refused(),
      ),
      http.get('/api/b', ({ request }) =>
        request.headers.get('authorization') === 'Bearer new' ? HttpResponse.json('b') : refused(),
      ),
      http.post('/api/auth/refresh', async () => {
        refreshes += 1;
        await new Promise((wait) => setTimeout(wait, 20));
        return HttpResponse.json({ accessToken: 'new' });
      }),
    );
    setAccessToken('old');
    await expect(Promise.all([apiFetch('/api/a'), apiFetch('/api/b')])).resolves.toEqual([
      'a',
      'b',
    ]);
    expect(refreshes).toBe(1);
    setAccessToken(null);
  });

  it('ends the session when renewal is refused, and asks only once', async () => {
    let calls = 0;
    server.use(
      http.get('/api/visits', () => {
        calls += 1;
        return refused();
      }),
      http.post('/api/auth/refresh', () => refused()),
    );
    let ended = 0;
    const stop = onSessionEnded(() => (ended += 1));
    setAccessToken('old');
    await expect(apiFetch('/api/visits')).rejects.toMatchObject({ status: 401 });
    expect(calls).toBe(1);
    expect(ended).toBe(1);
    expect(getAccessToken()).toBeNull();
    stop();
  });

  it('never tries to renew after a refused sign-in', async () => {
    server.use(
      http.post('/api/auth/sign-in', () => errorResponse(401, 'AUTH_WRONG_CREDENTIALS', 'Wrong')),
    );
    // No refresh handler: an attempt to renew would be an unhandled request and fail the test.
    await expect(apiSend('/api/auth/sign-in', 'POST', { email: 'a@b.c' })).rejects.toMatchObject({
      code: 'AUTH_WRONG_CREDENTIALS',
    });
  });

  it('keeps the session on a wrong current password (422, as the server answers every wrong password)', async () => {
    setAccessToken('still-good');
    let ended = 0;
    const unsubscribe = onSessionEnded(() => (ended += 1));
    server.use(
      http.post('/api/auth/password', () =>
        errorResponse(
          422,
          'AUTH_CURRENT_PASSWORD_WRONG',
          'currentPassword: does not match your password',
          { field: 'currentPassword' },
        ),
      ),
    );
    // No refresh handler: an attempt to renew would be an unhandled request and fail the test.
    await expect(
      apiSend('/api/auth/password', 'POST', { currentPassword: 'x', newPassword: 'y' }),
    ).rejects.toMatchObject({ status: 422, code: 'AUTH_CURRENT_PASSWORD_WRONG' });
    expect(getAccessToken()).toBe('still-good');
    expect(ended).toBe(0);
    unsubscribe();
  });
});

describe('validation problems', () => {
  it('reads the { field, reason } items of a VALIDATION_FAILED answer', async () => {
    server.use(
      http.post('http://localhost:3000/api/participants', () =>
        errorResponse(
          400,
          'VALIDATION_FAILED',
          'code must be a string; siteId: expected a UUID, found "x"',
          {
            problems: [
              { field: 'code', reason: 'code must be a string' },
              { field: 'siteId', reason: 'siteId: expected a UUID, found "x"' },
            ],
          },
        ),
      ),
    );
    const error = (await apiSend('http://localhost:3000/api/participants', 'POST', {}).catch(
      (e: unknown) => e,
    )) as ApiError;
    expect(error).toBeInstanceOf(ApiError);
    expect(error.message).toBe('code must be a string; siteId: expected a UUID, found "x"');
    expect(error.problems).toEqual([
      { field: 'code', reason: 'code must be a string' },
      { field: 'siteId', reason: 'siteId: expected a UUID, found "x"' },
    ]);
  });

  it('has none for other errors or a malformed details field', () => {
    expect(new ApiError(404, 'VISIT_NOT_FOUND', 'No visit').problems).toEqual([]);
    expect(
      new ApiError(400, 'VALIDATION_FAILED', 'x', { problems: ['old text'] }).problems,
    ).toEqual([]);
  });
});

describe('apiUpload', () => {
  it('posts the form with the token and reports the server error as ApiError', async () => {
    let authorization: string | null = null;
    let kind: string | null = null;
    server.use(
      http.post('/api/visits/v1/recordings', async ({ request }) => {
        authorization = request.headers.get('authorization');
        const form = await request.formData();
        // jsdom's XMLHttpRequest drops a part's file name on the way, so check a text field.
        kind = form.has('file') ? String(form.get('kind')) : null;
        return errorResponse(
          422,
          'RECORDING_REJECTED',
          'Header field "number of signals": found "x", expected a whole number',
          { field: 'number of signals' },
        );
      }),
    );
    setAccessToken('tok');
    const form = new FormData();
    form.append('kind', 'resting');
    form.append('file', new File([new Uint8Array(300)], 'rest.edf'));
    const error = await apiUpload('/api/visits/v1/recordings', form).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 422, code: 'RECORDING_REJECTED' });
    expect(authorization).toBe('Bearer tok');
    expect(kind).toBe('resting');
    setAccessToken(null);
  });

  it('returns the JSON body of a success', async () => {
    server.use(
      http.post('/api/visits/v1/recordings', () =>
        HttpResponse.json({ id: 'r1' }, { status: 201 }),
      ),
    );
    const form = new FormData();
    form.append('file', new File(['x'], 'a.edf'));
    await expect(apiUpload('/api/visits/v1/recordings', form)).resolves.toEqual({ id: 'r1' });
  });
});

describe('withQuery', () => {
  it('leaves out empty values and encodes the rest', () => {
    expect(withQuery('/api/audit', { actor: 'a b', action: '', page: 2, from: undefined })).toBe(
      '/api/audit?actor=a+b&page=2',
    );
    expect(withQuery('/api/audit', {})).toBe('/api/audit');
  });
});
