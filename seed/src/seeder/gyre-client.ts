/**
 * A small client of Gyre's HTTP API for the demo seeder: JSON requests with a bearer token
 * and the multipart/form-data recording upload a technician's browser sends (RFC 7578).
 * One connection per request (no keep-alive), so a long pause between two uploads can never
 * meet a socket the server has just closed. Nothing here talks to the database.
 */
import { randomBytes } from 'node:crypto';
import { request as httpRequest } from 'node:http';

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
  /** The visit's current recording of this kind that the file replaces, and why. */
  replaces?: { recordingId: string; reason: string } | null;
}

interface RequestBody {
  contentType: string;
  bytes: Buffer;
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
    return this.exchange<T>('GET', path, undefined, [200]);
  }

  post<T>(path: string, body: unknown, expected: number[] = [200, 201, 204]): Promise<T> {
    return this.exchange<T>(
      'POST',
      path,
      { contentType: 'application/json', bytes: Buffer.from(JSON.stringify(body), 'utf8') },
      expected,
    );
  }

  /** `POST /api/visits/:visitId/recordings`, as the Intake screen sends it. */
  upload<T>(visitId: string, input: UploadInput): Promise<T> {
    const boundary = `gyre-demo-${randomBytes(12).toString('hex')}`;
    const parts: Buffer[] = [];
    const head = (disposition: string, type: string | null): Buffer =>
      Buffer.from(
        `--${boundary}\r\nContent-Disposition: form-data; ${disposition}\r\n` +
          (type === null ? '' : `Content-Type: ${type}\r\n`) +
          '\r\n',
      );
    parts.push(head('name="kind"', null), Buffer.from(`${input.kind}\r\n`));
    if (input.replaces) {
      parts.push(head('name="replaces"', null), Buffer.from(`${input.replaces.recordingId}\r\n`));
      parts.push(
        head('name="replacementReason"', null),
        Buffer.from(`${input.replaces.reason}\r\n`, 'utf8'),
      );
    }
    parts.push(
      head(`name="file"; filename="${input.fileName}"`, 'application/octet-stream'),
      Buffer.from(input.edf.buffer, input.edf.byteOffset, input.edf.byteLength),
      Buffer.from('\r\n'),
    );
    if (input.onsetCsv) {
      parts.push(
        head(`name="onsets"; filename="${input.onsetCsv.fileName}"`, 'text/csv'),
        Buffer.from(`${input.onsetCsv.text}\r\n`, 'utf8'),
      );
    }
    parts.push(Buffer.from(`--${boundary}--\r\n`));
    return this.exchange<T>(
      'POST',
      `/api/visits/${visitId}/recordings`,
      { contentType: `multipart/form-data; boundary=${boundary}`, bytes: Buffer.concat(parts) },
      [201],
    );
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

  private async exchange<T>(
    method: string,
    path: string,
    body: RequestBody | undefined,
    expected: number[],
  ): Promise<T> {
    const headers: Record<string, string | number> = { Accept: 'application/json' };
    if (body !== undefined) {
      headers['Content-Type'] = body.contentType;
      headers['Content-Length'] = body.bytes.length;
    }
    if (this.token !== null) headers.Authorization = `Bearer ${this.token}`;
    const response = await roundTrip(new URL(`${this.baseUrl}${path}`), method, headers, body);
    let parsed: unknown = null;
    if (response.text.length > 0) {
      try {
        parsed = JSON.parse(response.text);
      } catch {
        parsed = response.text;
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
        typeof error.message === 'string' ? error.message : response.text.slice(0, 300),
      );
    }
    return parsed as T;
  }
}

/** One HTTP exchange on its own connection (`agent: false`: no keep-alive). */
function roundTrip(
  url: URL,
  method: string,
  headers: Record<string, string | number>,
  body: RequestBody | undefined,
): Promise<{ status: number; text: string }> {
  return new Promise((resolve, reject) => {
    const req = httpRequest(url, { method, headers, agent: false }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () =>
        resolve({ status: res.statusCode ?? 0, text: Buffer.concat(chunks).toString('utf8') }),
      );
      res.on('error', reject);
    });
    req.on('error', (error) => reject(new Error(`${method} ${url.pathname}: ${error.message}`)));
    req.end(body?.bytes);
  });
}
