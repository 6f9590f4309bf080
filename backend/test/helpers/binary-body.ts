import type request from 'supertest';

/** supertest's `.parse(binaryBody)`: the body as bytes (superagent buffers only text by itself). */
export const binaryBody = ((
  response: NodeJS.ReadableStream,
  done: (error: Error | null, body: Buffer) => void,
): void => {
  const chunks: Buffer[] = [];
  response.on('data', (chunk: Buffer) => chunks.push(chunk));
  response.on('end', () => done(null, Buffer.concat(chunks)));
}) as unknown as Parameters<request.Test['parse']>[0];

/** supertest's `.parse(textBody)`: a streamed body (an NDJSON download, Server-Sent Events) as UTF-8 text. */
export const textBody = ((
  response: NodeJS.ReadableStream,
  done: (error: Error | null, body: string) => void,
): void => {
  let text = '';
  response.on('data', (chunk: Buffer) => (text += chunk.toString('utf8')));
  response.on('end', () => done(null, text));
}) as unknown as Parameters<request.Test['parse']>[0];
