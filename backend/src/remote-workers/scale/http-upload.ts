/**
 * Uploads a recording with node:http and a multipart body written here (RFC 7578), on a
 * connection of its own. Generating a large recording takes longer than the server keeps an
 * idle connection open (5 s), and a pooled connection that the server closes while a request
 * is being written fails with EPIPE (Node's fetch had the same trouble); a fresh connection
 * per upload cannot meet a closing one.
 */
import { randomBytes } from 'node:crypto';
import { request } from 'node:http';
import type { GeneratedUpload } from '../../robustness/crash/recording-files';

export async function uploadRecording(
  baseUrl: string,
  accessToken: string,
  visitId: string,
  upload: GeneratedUpload,
): Promise<{ status: number; body: unknown }> {
  const boundary = `gyre-scale-${randomBytes(12).toString('hex')}`;
  const part = (headers: string): Buffer => Buffer.from(`--${boundary}\r\n${headers}\r\n\r\n`);
  const chunks: Buffer[] = [
    part('Content-Disposition: form-data; name="kind"'),
    Buffer.from(`${upload.kind}\r\n`),
    part(
      'Content-Disposition: form-data; name="file"; filename="recording.edf"\r\nContent-Type: application/octet-stream',
    ),
    Buffer.from(upload.bytes.buffer, upload.bytes.byteOffset, upload.bytes.byteLength),
    Buffer.from('\r\n'),
  ];
  if (upload.onsetsCsv !== null) {
    chunks.push(
      part(
        'Content-Disposition: form-data; name="onsets"; filename="onsets.csv"\r\nContent-Type: text/csv',
      ),
      Buffer.from(`${upload.onsetsCsv}\r\n`),
    );
  }
  chunks.push(Buffer.from(`--${boundary}--\r\n`));
  const length = chunks.reduce((sum, chunk) => sum + chunk.length, 0);
  return new Promise((done, fail) => {
    const outgoing = request(
      `${baseUrl}/api/visits/${visitId}/recordings`,
      {
        method: 'POST',
        agent: false,
        headers: {
          Authorization: `Bearer ${accessToken}`,
          'Content-Type': `multipart/form-data; boundary=${boundary}`,
          'Content-Length': length,
        },
      },
      (response) => {
        let text = '';
        response.setEncoding('utf8');
        response.on('data', (chunk: string) => (text += chunk));
        response.on('end', () => done({ status: response.statusCode ?? 0, body: parsed(text) }));
      },
    );
    outgoing.on('error', fail);
    for (const chunk of chunks) outgoing.write(chunk);
    outgoing.end();
  });
}

function parsed(text: string): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return text;
  }
}
