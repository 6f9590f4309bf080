/**
 * The worker's side of the worker API, with Node's own fetch. A token read from the server's
 * data folder is read again after a 401: the server writes a new one at every start.
 */
import { createHash } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { readFile } from 'node:fs/promises';
import { Readable, Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { ReadableStream as WebReadableStream } from 'node:stream/web';
import type { ErrorBody, HealthReport } from '@gyre/shared';
import type { AttemptRef, RemoteTask } from './remote-job';
import { RESULT_CONTENT_TYPE, ResultBody } from './result-wire';
import type { WorkerSettings } from './worker-settings';

/** An answer the worker acts on: its status and the server's error body, if any. */
export class WorkerApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ErrorBody | null,
    what: string,
  ) {
    super(`${what}: HTTP ${status}${body === null ? '' : ` ${body.code}: ${body.message}`}`);
    this.name = 'WorkerApiError';
  }

  /** 409: the attempt is not current any more; the worker drops it. */
  get notCurrent(): boolean {
    return this.status === 409;
  }

  /** 401/403: the server does not take this token (revoked, or not a worker token). */
  get tokenRefused(): boolean {
    return this.status === 401 || this.status === 403;
  }

  /** 400/413/422: the server refuses this result for good; the worker reports a failure. */
  get refused(): boolean {
    return this.status === 400 || this.status === 413 || this.status === 422;
  }
}

export class WorkerApiClient {
  private token: string | null = null;

  constructor(private readonly settings: Pick<WorkerSettings, 'serverUrl' | 'token'>) {}

  async health(): Promise<HealthReport> {
    const response = await fetch(`${this.settings.serverUrl}/api/health`);
    if (!response.ok) throw await apiError(response, 'health');
    return (await response.json()) as HealthReport;
  }

  /**
   * Checks the token with a request about a job that cannot exist: a worker token gets 404,
   * a refused one 401, anything else 403.
   */
  async checkToken(): Promise<void> {
    const nobody = { jobId: '00000000-0000-4000-8000-000000000000', attempt: 1 };
    const response = await this.call('GET', nobody, 'input');
    await response.body?.cancel();
    if (response.status === 404) return;
    throw await apiError(response, 'the worker token');
  }

  async input(ref: AttemptRef): Promise<RemoteTask> {
    const response = await this.call('GET', ref, 'input');
    if (!response.ok) throw await apiError(response, 'input');
    return (await response.json()) as RemoteTask;
  }

  /**
   * Streams the stored file to `path`, hashing it on the way; a short or altered download is
   * an error here (BullMQ retries it), never a computation on the wrong bytes.
   */
  async download(ref: AttemptRef, path: string, sha256: string, bytes: number): Promise<void> {
    const response = await this.call('GET', ref, 'file');
    if (!response.ok || response.body === null) throw await apiError(response, 'file');
    const hash = createHash('sha256');
    let received = 0;
    const tap = new Transform({
      transform(chunk: Buffer, _encoding, done) {
        hash.update(chunk);
        received += chunk.length;
        done(null, chunk);
      },
    });
    await pipeline(
      Readable.fromWeb(response.body as WebReadableStream<Uint8Array>),
      tap,
      createWriteStream(path, { mode: 0o600 }),
    );
    const actual = hash.digest('hex');
    if (received !== bytes || actual !== sha256) {
      throw new Error(
        `download of job ${ref.jobId}: ${received} bytes with SHA-256 ${actual}, ${bytes} bytes with ${sha256} expected`,
      );
    }
  }

  async progress(ref: AttemptRef, percent: number): Promise<void> {
    const response = await this.call('POST', ref, 'progress', {
      type: 'application/json',
      body: JSON.stringify({ percent }),
    });
    if (!response.ok) throw await apiError(response, 'progress');
  }

  async result(
    ref: AttemptRef,
    body: ResultBody,
  ): Promise<{ runId: string | null; newRun: boolean; duplicate: boolean }> {
    const response = await this.call('POST', ref, 'result', {
      type: RESULT_CONTENT_TYPE,
      body: JSON.stringify(body),
    });
    if (!response.ok) throw await apiError(response, 'result');
    return (await response.json()) as { runId: string | null; newRun: boolean; duplicate: boolean };
  }

  async failure(ref: AttemptRef, message: string): Promise<void> {
    const response = await this.call('POST', ref, 'failure', {
      type: 'application/json',
      body: JSON.stringify({ message: message.slice(0, 4000) }),
    });
    if (!response.ok) throw await apiError(response, 'failure');
  }

  private async call(
    method: 'GET' | 'POST',
    ref: AttemptRef,
    what: string,
    payload?: { type: string; body: string },
  ): Promise<Response> {
    const url = `${this.settings.serverUrl}/api/worker/jobs/${ref.jobId}/${ref.attempt}/${what}`;
    const send = async (): Promise<Response> =>
      fetch(url, {
        method,
        headers: {
          Authorization: `Bearer ${await this.bearer()}`,
          ...(payload === undefined ? {} : { 'Content-Type': payload.type }),
        },
        body: payload?.body,
      });
    const response = await send();
    if (response.status !== 401 || this.settings.token.kind !== 'file') return response;
    // The server may have started again and written a new token: read it once more.
    await response.body?.cancel();
    this.token = null;
    return send();
  }

  private async bearer(): Promise<string> {
    const source = this.settings.token;
    if (source.kind === 'value') return source.value;
    if (this.token === null) {
      try {
        this.token = (await readFile(source.path, 'utf8')).trim();
      } catch (error) {
        throw new Error(
          `cannot read the worker token at ${source.path} (${(error as NodeJS.ErrnoException).code ?? String(error)}): set GYRE_WORKER_TOKEN, or GYRE_DATA_DIR to the server's data folder`,
          { cause: error },
        );
      }
    }
    return this.token;
  }
}

async function apiError(response: Response, what: string): Promise<WorkerApiError> {
  const body = await response.json().then(
    (parsed) => parsed as ErrorBody,
    () => null,
  );
  return new WorkerApiError(response.status, body, what);
}
