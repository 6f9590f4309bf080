// express.static, not @nestjs/serve-static (dependency removed): its fallback answers index.html to every unmatched GET (a missing /assets file would get the page, not 404), it serves source maps, and it cannot give the page no-cache beside immutable assets.
import { existsSync } from 'node:fs';
import { join, resolve } from 'node:path';
import express, {
  type Express,
  type NextFunction,
  type Request,
  type RequestHandler,
  type Response,
} from 'express';

const REPO_ROOT = resolve(__dirname, '..', '..');

/** Where the built client and the fonts are; the tests point these at folders of their own. */
export interface ClientFolders {
  clientDir: string;
  fontsDir: string;
}

const DEFAULT_FOLDERS: ClientFolders = {
  clientDir: join(REPO_ROOT, 'frontend', 'dist'),
  fontsDir: join(REPO_ROOT, 'fonts'),
};

/** Vite names every file in assets/ after a hash of its content: a new build, new names. */
const HASHED_ASSET_CACHE = 'public, max-age=31536000, immutable';
/** index.html names the current assets, so the browser must ask whether it changed each time. */
export const PAGE_CACHE = 'no-cache';

const notFound: RequestHandler = (_request, response) => {
  response.status(404).type('text/plain').send('Not found');
};

/** Source maps would publish the client's source; the build makes none, and none are served. */
const refuseSourceMaps: RequestHandler = (request, response, next) => {
  if (request.path.endsWith('.map')) notFound(request, response, next);
  else next();
};

const noCache = (response: Response): void => {
  response.setHeader('Cache-Control', PAGE_CACHE);
};

/**
 * Serves the shipped fonts under /fonts, the built client's hashed files under /assets (a
 * year, immutable; a missing one is a 404), its other files and index.html revalidated on
 * every use, and index.html for the client's own routes; /api stays the API's. Responses are
 * plain files, so a compression middleware in front of this works unchanged.
 */
export function serveClient(
  server: Express,
  folders: ClientFolders = DEFAULT_FOLDERS,
): { clientBuilt: boolean } {
  const { clientDir, fontsDir } = folders;
  // Font files keep their names from release to release but never change within one.
  server.use('/fonts', express.static(fontsDir, { immutable: true, maxAge: '30d' }), notFound);
  const indexFile = join(clientDir, 'index.html');
  if (!existsSync(indexFile)) return { clientBuilt: false };
  server.use(
    '/assets',
    refuseSourceMaps,
    express.static(join(clientDir, 'assets'), {
      index: false,
      cacheControl: false,
      setHeaders: (response) => response.setHeader('Cache-Control', HASHED_ASSET_CACHE),
    }),
    notFound,
  );
  server.use((request: Request, response: Response, next: NextFunction) => {
    if (request.path.startsWith('/api')) next();
    else refuseSourceMaps(request, response, next);
  });
  server.use(express.static(clientDir, { index: false, cacheControl: false, setHeaders: noCache }));
  server.use((request: Request, response: Response, next: NextFunction) => {
    const isPage =
      (request.method === 'GET' || request.method === 'HEAD') && !request.path.startsWith('/api');
    if (isPage && request.accepts('html')) {
      response.sendFile(indexFile, {
        cacheControl: false,
        headers: { 'Cache-Control': PAGE_CACHE },
      });
    } else {
      next();
    }
  });
  return { clientBuilt: true };
}
