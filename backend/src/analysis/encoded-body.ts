/**
 * A JSON answer serialised and compressed once, then sent as it is to every caller: the
 * compression middleware leaves a body alone once it names its Content-Encoding.
 */
import { promisify } from 'node:util';
import { brotliCompress, constants, gzip } from 'node:zlib';
import type { Request, Response } from 'express';

const gzipAsync = promisify(gzip);
const brotliAsync = promisify(brotliCompress);

export interface EncodedBody {
  json: Buffer;
  gzip: Buffer;
  br: Buffer;
}

export function encodedSize(body: EncodedBody): number {
  return body.json.byteLength + body.gzip.byteLength + body.br.byteLength;
}

/**
 * Serialises and compresses once, at the strongest settings (the cost is paid once per body,
 * off the event loop in libuv's thread pool).
 */
export async function encodeJson(value: unknown): Promise<EncodedBody> {
  const json = Buffer.from(JSON.stringify(value), 'utf8');
  const [gzipped, brotli] = await Promise.all([
    gzipAsync(json, { level: constants.Z_BEST_COMPRESSION }),
    brotliAsync(json, {
      params: {
        [constants.BROTLI_PARAM_QUALITY]: constants.BROTLI_MAX_QUALITY,
        [constants.BROTLI_PARAM_MODE]: constants.BROTLI_MODE_TEXT,
        [constants.BROTLI_PARAM_SIZE_HINT]: json.byteLength,
      },
    }),
  ]);
  return { json, gzip: gzipped, br: brotli };
}

/**
 * The smallest encoding the client accepts (RFC 9110 §12.5.3): br, else gzip, else none. A
 * request without Accept-Encoding gets the JSON as it is, as the compression middleware does.
 */
function encodingFor(request: Request): 'br' | 'gzip' | 'identity' {
  if (request.headers['accept-encoding'] === undefined) return 'identity';
  if (request.acceptsEncodings('br') === 'br') return 'br';
  if (request.acceptsEncodings('gzip') === 'gzip') return 'gzip';
  return 'identity';
}

/** 200 with the body in the chosen encoding; headers set earlier (Cache-Control) stay. */
export function sendEncoded(request: Request, response: Response, body: EncodedBody): void {
  const encoding = encodingFor(request);
  const bytes = encoding === 'identity' ? body.json : body[encoding];
  response.vary('Accept-Encoding');
  response.setHeader('Content-Type', 'application/json; charset=utf-8');
  if (encoding !== 'identity') response.setHeader('Content-Encoding', encoding);
  response.setHeader('Content-Length', String(bytes.byteLength));
  response.status(200).end(bytes);
}
