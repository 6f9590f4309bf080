import type { ErrorBody, ValidationProblem } from '@gyre/shared';
import { forgetSession, mightHaveSession } from './session/session-hint';

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

  get isForbidden(): boolean {
    return this.status === 403;
  }

  /** A `VALIDATION_FAILED` answer's `{ field, reason }` items (none for other errors). */
  get problems(): ValidationProblem[] {
    const problems = this.details?.problems;
    if (!Array.isArray(problems)) return [];
    return problems.filter(
      (p): p is ValidationProblem =>
        typeof p === 'object' &&
        p !== null &&
        typeof (p as ValidationProblem).field === 'string' &&
        typeof (p as ValidationProblem).reason === 'string',
    );
  }
}

/** Where the server renews the access token from the httpOnly refresh cookie. */
export const REFRESH_PATH = '/api/auth/refresh';

/** Requests whose 401 means "wrong credentials or token", never "access token expired". */
const NO_REFRESH_PATHS = [
  REFRESH_PATH,
  '/api/auth/sign-in',
  '/api/auth/password-reset',
  '/api/auth/accept-invitation',
];

let accessToken: string | null = null;

/** The short-lived access token lives in memory only; the refresh token is an httpOnly cookie. */
export function setAccessToken(token: string | null): void {
  accessToken = token;
}

export function getAccessToken(): string | null {
  return accessToken;
}

type SessionListener = () => void;
const sessionEndedListeners = new Set<SessionListener>();

/**
 * Called when a request was refused with 401 and the refresh cookie could not renew the
 * session: the user must sign in again. Returns the function that unsubscribes.
 */
export function onSessionEnded(listener: SessionListener): () => void {
  sessionEndedListeners.add(listener);
  return () => sessionEndedListeners.delete(listener);
}

function endSession(): void {
  accessToken = null;
  forgetSession();
  for (const listener of [...sessionEndedListeners]) listener();
}

function isErrorBody(value: unknown): value is ErrorBody {
  return (
    typeof value === 'object' &&
    value !== null &&
    typeof (value as ErrorBody).statusCode === 'number' &&
    typeof (value as ErrorBody).code === 'string'
  );
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return text;
  }
}

/** Turns a failed response's status and body text into an {@link ApiError}. */
export function errorFromResponse(status: number, text: string): ApiError {
  const body: unknown = text.length > 0 ? safeJson(text) : null;
  if (isErrorBody(body)) {
    return new ApiError(body.statusCode, body.code, body.message, body.details);
  }
  return new ApiError(status, 'HTTP_ERROR', `The server answered ${status}.`);
}

const networkError = () =>
  new ApiError(0, 'NETWORK', 'Gyre could not reach the server. Check your connection.');

function pathOf(url: string): string {
  return new URL(url, window.location.href).pathname;
}

function mayRefreshFor(url: string): boolean {
  const path = pathOf(url);
  return !NO_REFRESH_PATHS.some((prefix) => path.startsWith(prefix));
}

let refreshing: Promise<boolean> | null = null;

/**
 * Asks for a new access token with the refresh cookie. Concurrent callers share one request,
 * because the server rotates the refresh token and would treat a second use as theft.
 */
export function refreshAccessToken(): Promise<boolean> {
  refreshing ??= (async () => {
    try {
      const response = await fetch(REFRESH_PATH, {
        method: 'POST',
        headers: { Accept: 'application/json' },
        credentials: 'include',
      });
      if (!response.ok) {
        // The cookie is gone or spent: stop assuming this browser has a session.
        if (response.status === 401) forgetSession();
        return false;
      }
      const body = safeJson(await response.text());
      const token =
        typeof body === 'object' && body !== null && 'accessToken' in body
          ? body.accessToken
          : null;
      if (typeof token !== 'string') return false;
      accessToken = token;
      return true;
    } catch {
      return false;
    } finally {
      refreshing = null;
    }
  })();
  return refreshing;
}

/**
 * Runs `send` and, when it is refused with 401, renews the access token once and runs it
 * again. If renewal fails the session has ended and every listener is told.
 */
async function withRefresh<R extends { status: number }>(
  url: string,
  send: () => Promise<R>,
): Promise<R> {
  // After a reload the token is gone from memory; renew it first rather than be refused.
  if (accessToken === null && mayRefreshFor(url) && mightHaveSession()) {
    await refreshAccessToken();
  }
  const first = await send();
  if (first.status !== 401 || !mayRefreshFor(url)) return first;
  const hadToken = accessToken !== null;
  if (await refreshAccessToken()) return send();
  // A 401 without any token is "not signed in yet"; the caller decides where to go.
  if (hadToken) endSession();
  return first;
}

/** The one HTTP client: sends credentials, JSON in and out, API errors as {@link ApiError}. */
export async function apiFetch<T>(path: string, init: RequestInit = {}): Promise<T> {
  const send = async (): Promise<Response> => {
    const headers = new Headers(init.headers);
    headers.set('Accept', 'application/json');
    if (init.body !== undefined && !(init.body instanceof FormData)) {
      headers.set('Content-Type', 'application/json');
    }
    if (accessToken !== null) headers.set('Authorization', `Bearer ${accessToken}`);
    try {
      return await fetch(path, { ...init, headers, credentials: 'include' });
    } catch {
      throw networkError();
    }
  };
  const response = await withRefresh(path, send);
  const text = await response.text();
  if (!response.ok) throw errorFromResponse(response.status, text);
  return (text.length > 0 ? safeJson(text) : null) as T;
}

/** `apiFetch` of something that may not exist yet: its 404 answers null instead of failing. */
export async function apiFetchOrNull<T>(path: string): Promise<T | null> {
  try {
    return await apiFetch<T>(path);
  } catch (error) {
    if (error instanceof ApiError && error.status === 404) return null;
    throw error;
  }
}

/** `apiFetch` with a JSON body. */
export function apiSend<T>(
  path: string,
  method: 'POST' | 'PATCH' | 'PUT' | 'DELETE',
  body?: unknown,
): Promise<T> {
  return apiFetch<T>(path, {
    method,
    body: body === undefined ? undefined : JSON.stringify(body),
  });
}

/** Fetches a file (a CSV export, a report PDF) with the session and returns its bytes. */
export async function apiDownload(path: string): Promise<{ blob: Blob; fileName: string | null }> {
  const send = async (): Promise<Response> => {
    const headers = new Headers();
    if (accessToken !== null) headers.set('Authorization', `Bearer ${accessToken}`);
    try {
      return await fetch(path, { headers, credentials: 'include' });
    } catch {
      throw networkError();
    }
  };
  const response = await withRefresh(path, send);
  if (!response.ok) throw errorFromResponse(response.status, await response.text());
  const disposition = response.headers.get('content-disposition') ?? '';
  const match = /filename\*?=(?:UTF-8'')?"?([^";]+)"?/i.exec(disposition);
  return {
    blob: await response.blob(),
    fileName: match ? decodeURIComponent(match[1]) : null,
  };
}

/** Hands a downloaded file to the browser as a save. */
export function saveBlob(blob: Blob, fileName: string): void {
  const url = URL.createObjectURL(blob);
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 1000);
}

export interface UploadProgress {
  loadedBytes: number;
  totalBytes: number;
  /** 0–100. */
  percent: number;
}

export interface UploadOptions {
  onProgress?: (progress: UploadProgress) => void;
  signal?: AbortSignal;
}

interface XhrOutcome {
  status: number;
  text: string;
}

/**
 * Posts a multipart form with upload progress. `fetch` cannot report request-body progress,
 * so this one call uses XMLHttpRequest; it shares the token, the refresh-once rule and
 * {@link ApiError} with {@link apiFetch}.
 */
export async function apiUpload<T>(
  path: string,
  form: FormData,
  options: UploadOptions = {},
): Promise<T> {
  const send = () =>
    new Promise<XhrOutcome>((resolve, reject) => {
      const request = new XMLHttpRequest();
      request.open('POST', path);
      request.withCredentials = true;
      request.setRequestHeader('Accept', 'application/json');
      if (accessToken !== null) request.setRequestHeader('Authorization', `Bearer ${accessToken}`);
      request.upload.onprogress = (event) => {
        if (!event.lengthComputable) return;
        options.onProgress?.({
          loadedBytes: event.loaded,
          totalBytes: event.total,
          percent: event.total > 0 ? (event.loaded / event.total) * 100 : 0,
        });
      };
      request.onload = () => resolve({ status: request.status, text: request.responseText });
      request.onerror = () => reject(networkError());
      request.onabort = () =>
        reject(new ApiError(0, 'ABORTED', 'The upload was cancelled before it finished.'));
      if (options.signal !== undefined) {
        if (options.signal.aborted) {
          request.abort();
          return;
        }
        options.signal.addEventListener('abort', () => request.abort(), { once: true });
      }
      request.send(form);
    });
  const outcome = await withRefresh(path, send);
  if (outcome.status < 200 || outcome.status >= 300) {
    throw errorFromResponse(outcome.status, outcome.text);
  }
  return (outcome.text.length > 0 ? safeJson(outcome.text) : null) as T;
}

/** SWR's fetcher: the key is the API path. */
export const fetcher = <T>(path: string): Promise<T> => apiFetch<T>(path);

/** A query string from the set values of `params` (empty and undefined ones left out). */
export function withQuery(
  path: string,
  params: Record<string, string | number | undefined | null>,
): string {
  const search = new URLSearchParams();
  for (const [name, value] of Object.entries(params)) {
    if (value !== undefined && value !== null && value !== '') search.set(name, String(value));
  }
  const query = search.toString();
  return query.length > 0 ? `${path}?${query}` : path;
}
