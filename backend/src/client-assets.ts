import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import express, { type Express, type NextFunction, type Request, type Response } from 'express';

const REPO_ROOT = resolve(__dirname, '..', '..');

/**
 * Serves the shipped fonts under /fonts and the built client with a fallback to
 * index.html for client-side routes; /api stays the API's.
 */
export function serveClient(server: Express): { clientBuilt: boolean } {
  const fontsDir = join(REPO_ROOT, 'fonts');
  const clientDir = join(REPO_ROOT, 'frontend', 'dist');
  server.use(
    '/fonts',
    express.static(fontsDir, { immutable: true, maxAge: '30d', fallthrough: false }),
  );
  const indexFile = join(clientDir, 'index.html');
  if (!existsSync(indexFile)) return { clientBuilt: false };
  server.use(express.static(clientDir, { index: false }));
  server.use((request: Request, response: Response, next: NextFunction) => {
    const isPage = request.method === 'GET' && !request.path.startsWith('/api');
    if (isPage && request.accepts('html')) response.sendFile(indexFile);
    else next();
  });
  return { clientBuilt: true };
}
