/**
 * A small client of Gyre's HTTP API for the demo seeder: JSON requests with a bearer token
 * and the multipart recording upload a technician's browser sends. Node's own fetch,
 * FormData and Blob; nothing here talks to the database.
 */

/** An answer other than the one expected, with Gyre's error body when there is one. */
export class GyreApiError extends Error {
  constructor(
    readonly method: string,
    readonly path: string,
    readonly status: number,
    readonly code: string | null,
    readonly details: unknown,
    message: string,
  ) {
    super(`${method} ${path}: HTTP ${status}${code ? ` ${code}` : ''}: ${message}`);
    this.name = 'GyreApiError';
  }
}

export interface UploadInput {
  kind: 'resting' | 'task';
  fileName: string;
  edf: Uint8Array;
  onsetCsv?: { fileName: string; text: string } | null;
}

export class GyreClient {
  constructor(
    /** e.g. `http://127.0.0.1:3000` (no trailing slash, no `/api`). */
    readonly baseUrl: string,
    readonly token: string | null = null,
  ) {}

  withToken(token: string): GyreClient {
    return new GyreClient(this.baseUrl, token);
  }

  get<T>(path: string): Promise<T> {
    return this.send<T>('GET', path, undefined, [200]);
  }

  post<T>(path: string, body: unknown, expected: number[] = [200, 201, 204]): Promise<T> {
    return this.send<T>('POST', path, body, expected);
  }

  /** `POST /api/visits/:visitId/recordings`, as the Intake screen sends it. */
  async upload<T>(visitId: string, input: UploadInput): Promise<T> {
    const form = new FormData();
    form.append('kind', input.kind);
    form.append(
      'file',
      new Blob([input.edf], { type: 'application/octet-stream' }),
      input.fileName,
    );
    if (input.onsetCsv) {
      form.append(
        'onsets',
        new Blob([input.onsetCsv.text], { type: 'text/csv' }),
        input.onsetCsv.fileName,
      );
    }
    return this.exchange<T>('POST', `/api/visits/${visitId}/recordings`, form, [201]);
  }

  /** Signs in through `POST /api/auth/sign-in` and returns a client holding the access token. */
  async signIn(email: string, password: string): Promise<GyreClient> {
    const session = await this.post<{ accessToken: string }>(
      '/api/auth/sign-in',
      { email, password },
      [200],
    );
    return this.withToken(session.accessToken);
  }

  private send<T>(method: string, path: string, body: unknown, expected: number[]): Promise<T> {
    return this.exchange<T>(
      method,
      path,
      body === undefined ? undefined : JSON.stringify(body),
      expected,
    );
  }

  private async exchange<T>(
    method: string,
    path: string,
    body: string | FormData | undefined,
    expected: number[],
  ): Promise<T> {
    const headers: Record<string, string> = { Accept: 'application/json' };
    if (typeof body === 'string') headers['Content-Type'] = 'application/json';
    if (this.token !== null) headers.Authorization = `Bearer ${this.token}`;
    const response = await fetch(`${this.baseUrl}${path}`, { method, headers, body });
    const text = await response.text();
    let parsed: unknown = null;
    if (text.length > 0) {
      try {
        parsed = JSON.parse(text);
      } catch {
        parsed = text;
      }
    }
    if (!expected.includes(response.status)) {
      const error =
        typeof parsed === 'object' && parsed !== null ? (parsed as Record<string, unknown>) : {};
      throw new GyreApiError(
        method,
        path,
        response.status,
        typeof error.code === 'string' ? error.code : null,
        error.details ?? null,
        typeof error.message === 'string' ? error.message : String(text).slice(0, 300),
      );
    }
    return parsed as T;
  }
}
