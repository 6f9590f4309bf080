import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { server, installMswServer } from '../test/msw-server';
import { ApiError, apiFetch, setAccessToken } from './api-client';

installMswServer();

describe('apiFetch', () => {
  it('turns the API error body into a typed ApiError', async () => {
    server.use(
      http.get('http://localhost:3000/api/visits/7', () =>
        HttpResponse.json(
          { statusCode: 404, code: 'VISIT_NOT_FOUND', message: 'Visit 7 not found', details: null },
          { status: 404 },
        ),
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
