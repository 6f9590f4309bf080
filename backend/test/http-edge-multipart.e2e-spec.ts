/**
 * Malformed multipart/form-data (RFC 7578) on the upload route, sent as raw bytes through
 * node:http because supertest only builds well-formed forms. Each must answer 400 with
 * Gyre's error body naming what is wrong, and keep nothing: no row, no audit entry, no
 * temporary file.
 */
import { existsSync, readdirSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import { join } from 'node:path';
import { countOf } from './helpers/row-count';
import { useTestApp } from './helpers/test-app';
import { syntheticTaskEdf } from './recordings-fixtures';
import { seededUniform } from '../src/signal/random/random';

interface RawResponse {
  status: number;
  body: { statusCode: number; code: string; message: string; details: Record<string, unknown> };
}

/** POSTs `body` as it is, in `chunkBytes` writes; resolves with the parsed JSON answer. */
function rawPost(
  baseUrl: string,
  path: string,
  headers: Record<string, string>,
  body: Buffer,
  chunkBytes = body.byteLength || 1,
): Promise<RawResponse> {
  const url = new URL(baseUrl);
  return new Promise((resolve, reject) => {
    const req = httpRequest(
      {
        host: url.hostname,
        port: url.port,
        path,
        method: 'POST',
        headers: { ...headers, 'Content-Length': String(body.byteLength) },
      },
      (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => {
          try {
            resolve({
              status: res.statusCode ?? 0,
              body: JSON.parse(Buffer.concat(chunks).toString('utf8')) as RawResponse['body'],
            });
          } catch (error) {
            reject(error instanceof Error ? error : new Error(String(error)));
          }
        });
      },
    );
    req.on('error', reject);
    let offset = 0;
    const writeNext = (): void => {
      while (offset < body.byteLength) {
        const chunk = body.subarray(offset, offset + chunkBytes);
        offset += chunk.byteLength;
        if (!req.write(chunk)) {
          req.once('drain', writeNext);
          return;
        }
      }
      req.end();
    };
    writeNext();
  });
}

const BOUNDARY = 'gyre-test-boundary-7c1f';
const CRLF = '\r\n';

/** A form part as RFC 7578 §4.2 lays it out, without the trailing CRLF. */
function part(headers: string[], content: Buffer | string): Buffer {
  return Buffer.concat([
    Buffer.from(`--${BOUNDARY}${CRLF}${headers.join(CRLF)}${CRLF}${CRLF}`, 'latin1'),
    Buffer.isBuffer(content) ? content : Buffer.from(content, 'latin1'),
    Buffer.from(CRLF, 'latin1'),
  ]);
}

const kindPart = part(['Content-Disposition: form-data; name="kind"'], 'task');
const filePart = (disposition: string, bytes: Buffer): Buffer =>
  part([disposition, 'Content-Type: application/octet-stream'], bytes);
const closing = Buffer.from(`--${BOUNDARY}--${CRLF}`, 'latin1');

const EDF = Buffer.from(
  syntheticTaskEdf({ durationS: 10, channels: ['EEG O1-REF', 'EEG O2-REF'], onsetsS: [3, 6] }),
);
/** The EDF as the form's file part, its file name written into the header as given. */
const edfPart = (fileName = 'r.edf'): Buffer =>
  filePart(`Content-Disposition: form-data; name="file"; filename="${fileName}"`, EDF);
/** The form as a browser sends it: the kind, the file, the closing boundary. */
const WELL_FORMED_FORM = Buffer.concat([kindPart, edfPart(), closing]);
const FORM_CONTENT_TYPE = `multipart/form-data; boundary=${BOUNDARY}`;

describe('malformed multipart uploads (RFC 7578)', () => {
  const t = useTestApp();
  let path: string;
  let headers: Record<string, string>;
  beforeAll(async () => {
    path = `/api/visits/${t.seed.visits.A1.id}/recordings`;
    headers = await t.authHeader('technician');
  });

  const count = (table: string): Promise<number> => countOf(t, table);

  /** Sends the body and checks the 400 and that nothing at all was kept. */
  async function expectRefused(
    contentType: string,
    body: Buffer,
    message: RegExp,
    chunkBytes?: number,
  ): Promise<RawResponse> {
    const recordingsBefore = await count('recording');
    const auditBefore = await count('audit_entry');
    const response = await rawPost(
      t.url,
      path,
      { ...headers, 'Content-Type': contentType },
      body,
      chunkBytes,
    );
    expect(response.status).toBe(400);
    expect(response.body).toMatchObject({
      statusCode: 400,
      code: 'RECORDING_FORM_INVALID',
      details: {
        field: expect.any(String),
        found: expect.any(String),
        expected: expect.any(String),
      },
    });
    expect(response.body.message).toMatch(message);
    expect(await count('recording')).toBe(recordingsBefore);
    expect(await count('audit_entry')).toBe(auditBefore);
    const tmp = join(t.config.uploadsDir, 'tmp');
    expect(existsSync(tmp) ? readdirSync(tmp) : []).toEqual([]);
    expect(existsSync(t.config.uploadsDir) ? readdirSync(t.config.uploadsDir) : []).toEqual(
      existsSync(tmp) ? ['tmp'] : [],
    );
    return response;
  }

  it('a Content-Type without a boundary parameter (RFC 7578 §4.1)', async () => {
    const response = await expectRefused(
      'multipart/form-data',
      WELL_FORMED_FORM,
      /^Content-Type: .*boundary/i,
    );
    expect(response.body.details.field).toBe('Content-Type');
  });

  it('random bytes as the body', async () => {
    // Generated noise (the backend's one seeded generator), the same on every run.
    const random = seededUniform(0x2545f491);
    const noise = Buffer.alloc(64 * 1024);
    for (let i = 0; i < noise.byteLength; i++) noise[i] = Math.floor(random() * 256);
    await expectRefused(FORM_CONTENT_TYPE, noise, /^multipart body: .*closing boundary/);
  });

  it('a body cut off inside the file part, before the closing boundary', async () => {
    await expectRefused(
      FORM_CONTENT_TYPE,
      WELL_FORMED_FORM.subarray(0, kindPart.byteLength + 2000),
      /^multipart body: a body that ends before its closing boundary found/,
    );
  });

  it('a body without its closing boundary line', async () => {
    await expectRefused(
      FORM_CONTENT_TYPE,
      Buffer.concat([kindPart, edfPart()]),
      /closing boundary/,
    );
  });

  it('a file name containing CR LF breaks the part header', async () => {
    await expectRefused(
      FORM_CONTENT_TYPE,
      Buffer.concat([kindPart, edfPart('r\r\nb.edf'), closing]),
      /^multipart body: a malformed part header/,
    );
  });

  it('a file name whose CR LF starts another header line leaves no readable file part', async () => {
    const response = await expectRefused(
      FORM_CONTENT_TYPE,
      Buffer.concat([kindPart, edfPart('r\r\nX-Evil: 1.edf'), closing]),
      /^file part 'file': none with a readable Content-Disposition header found/,
    );
    expect(response.body.details.field).toBe("file part 'file'");
  });

  it('a file name with CR LF percent-encoded in filename* (RFC 5987) is refused by name', async () => {
    const response = await expectRefused(
      FORM_CONTENT_TYPE,
      Buffer.concat([
        kindPart,
        filePart(
          'Content-Disposition: form-data; name="file"; filename*=utf-8\'\'r%0D%0AX-Evil%3A%201.edf',
          EDF,
        ),
        closing,
      ]),
      /^file name of part 'file': a control character/,
    );
    expect(response.body.details.field).toBe("file name of part 'file'");
  });

  it('parts beyond the form’s 6 (say, with no readable Content-Disposition) are refused, not dropped', async () => {
    const nameless = part(['Content-Type: text/plain'], 'x');
    const response = await expectRefused(
      FORM_CONTENT_TYPE,
      Buffer.concat([...Array.from({ length: 6 }, () => nameless), WELL_FORMED_FORM]),
      /^parts: more than 6 parts found/,
    );
    expect(response.body.details.field).toBe('parts');
  });

  it('a 4 MB body whose first part header is broken still gets its 400 (the rest is drained, not reset)', async () => {
    const big = Buffer.alloc(4 * 1024 * 1024, 0x41);
    await expectRefused(
      FORM_CONTENT_TYPE,
      Buffer.concat([
        filePart('Content-Disposition: form-data; name="file"; filename="a\nb.edf"', big),
        closing,
      ]),
      /malformed part header/,
      64 * 1024,
    );
  });

  it('a well-formed upload right after all of these is still accepted (control)', async () => {
    const response = await rawPost(
      t.url,
      path,
      { ...headers, 'Content-Type': FORM_CONTENT_TYPE },
      WELL_FORMED_FORM,
    );
    expect(response.status).toBe(201);
  });
});
