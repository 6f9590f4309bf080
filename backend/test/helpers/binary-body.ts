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
