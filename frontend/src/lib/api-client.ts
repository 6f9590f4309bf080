import type { ErrorBody } from '@gyre/shared';

/** An error the API answered with, typed after the server's `{ statusCode, code, message, details }`. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details: Record<string, unknown> | null = null,
  ) {
    super(message);
    this.name = 'ApiError';
  }

  get isUnauthenticated(): boolean {
    return this.status === 401;
  }
}

let accessToken: string | null = null;

/** The short-lived access token lives in memory only; the refresh token is an httpOnly cookie. */
export function setAccessToken(token: string | null): void {
  accessToken = token;
}

export function getAccessToken(): string | null {
  return accessToken;
}

function isErrorBody(value: unknown): value is ErrorBody {
  return (
    typeof value === 'object' &&
    value !== null &&
    typeof (value as ErrorBody).statusCode === 'number' &&
    typeof (value as ErrorBody).code === 'string'
  );
}

/** The one HTTP client: sends credentials, JSON in and out, API errors as {@link ApiError}. */
export async function apiFetch<T>(path: string, init: RequestInit = {}): Promise<T> {
  const headers = new Headers(init.headers);
  headers.set('Accept', 'application/json');
  if (init.body !== undefined && !(init.body instanceof FormData)) {
    headers.set('Content-Type', 'application/json');
  }
  if (accessToken !== null) headers.set('Authorization', `Bearer ${accessToken}`);
  let response: Response;
  try {
    response = await fetch(path, { ...init, headers, credentials: 'include' });
  } catch {
    throw new ApiError(0, 'NETWORK', 'Gyre could not reach the server. Check your connection.');
  }
  const text = await response.text();
  const body: unknown = text.length > 0 ? safeJson(text) : null;
  if (!response.ok) {
    if (isErrorBody(body)) {
      throw new ApiError(body.statusCode, body.code, body.message, body.details);
    }
    throw new ApiError(response.status, 'HTTP_ERROR', `The server answered ${response.status}.`);
  }
  return body as T;
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return text;
  }
}

/** SWR's fetcher: the key is the API path. */
export const fetcher = <T>(path: string): Promise<T> => apiFetch<T>(path);
