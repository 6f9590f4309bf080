/**
 * What a page really downloads: the JavaScript files Chromium requested for it, sized from
 * the built client on disk, raw and gzipped. Gzip at zlib's default level is what the
 * server's `compression` middleware sends (RFC 1952 framing); a file the page requested but
 * the build does not hold is an error, never a zero.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';

export interface FileSize {
  path: string;
  rawBytes: number;
  gzipBytes: number;
}

export interface FirstLoad {
  files: FileSize[];
  rawBytes: number;
  gzipBytes: number;
}

/** Sizes of the requested URL paths (`/assets/…js`) as files under `clientDir`. */
export function firstLoadOf(clientDir: string, requestedPaths: readonly string[]): FirstLoad {
  const unique = [...new Set(requestedPaths)].sort();
  const files = unique.map((path) => {
    if (!path.startsWith('/assets/')) {
      throw new Error(`${path}: the page requested a script outside /assets/`);
    }
    const bytes = readFileSync(join(clientDir, path));
    return { path, rawBytes: bytes.length, gzipBytes: gzipSync(bytes).length };
  });
  return {
    files,
    rawBytes: files.reduce((sum, file) => sum + file.rawBytes, 0),
    gzipBytes: files.reduce((sum, file) => sum + file.gzipBytes, 0),
  };
}
