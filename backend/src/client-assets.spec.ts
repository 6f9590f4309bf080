import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import compression from 'compression';
import express, { type Express } from 'express';
import request from 'supertest';
import { serveClient, type ClientFolders } from './client-assets';

// A built client of our own making: what `vite build` writes (index.html, hashed files in
// assets/, public files at the root, the manifest in .vite/), plus a source map that must not
// be served. The script is larger than compression's 1 kB threshold.
const INDEX_HTML =
  '<!doctype html><title>Gyre</title><script src="/assets/index-Ab12Cd34.js"></script>';
const SCRIPT = `export const screens = ${JSON.stringify(Array.from({ length: 200 }, (_, i) => `screen-${i}`))};\n`;

function writeClient(root: string): ClientFolders {
  const clientDir = join(root, 'dist');
  const fontsDir = join(root, 'fonts');
  mkdirSync(join(clientDir, 'assets'), { recursive: true });
  mkdirSync(join(clientDir, '.vite'), { recursive: true });
  mkdirSync(fontsDir);
  writeFileSync(join(clientDir, 'index.html'), INDEX_HTML);
  writeFileSync(join(clientDir, 'assets', 'index-Ab12Cd34.js'), SCRIPT);
  writeFileSync(join(clientDir, 'assets', 'index-Ab12Cd34.js.map'), '{"version":3}');
  writeFileSync(join(clientDir, 'stray.js.map'), '{"version":3}');
  writeFileSync(join(clientDir, 'gyre-mark.svg'), '<svg xmlns="http://www.w3.org/2000/svg"/>');
  writeFileSync(join(clientDir, '.vite', 'manifest.json'), '{"src/main.tsx":{"file":"x"}}');
  writeFileSync(join(fontsDir, 'plex.woff2'), Buffer.from([0x77, 0x4f, 0x46, 0x32]));
  return { clientDir, fontsDir };
}

/** The order app.factory.ts uses: compression in front, then the API, then the client. */
function appServing(folders: ClientFolders): Express {
  const app = express();
  app.use(compression());
  app.get('/api/health', (_request, response) => {
    response.json({ status: 'ok' });
  });
  serveClient(app, folders);
  return app;
}

describe('serveClient', () => {
  let root: string;
  let app: Express;

  beforeAll(() => {
    root = mkdtempSync(join(tmpdir(), 'gyre-client-assets-'));
    app = appServing(writeClient(root));
  });

  afterAll(() => rmSync(root, { recursive: true, force: true }));

  it('serves a hashed asset for a year as immutable, compressed behind compression()', async () => {
    const response = await request(app)
      .get('/assets/index-Ab12Cd34.js')
      .set('Accept-Encoding', 'gzip');
    expect(response.status).toBe(200);
    // RFC 9111 §5.2.2.1 (max-age, in seconds: 365 × 86 400) and RFC 8246 (immutable).
    expect(response.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    expect(response.headers['content-type']).toMatch(/^text\/javascript/);
    expect(response.headers['content-encoding']).toBe('gzip');
    expect(response.text).toBe(SCRIPT);
  });

  it.each(['/', '/sign-in', '/review/4f1d2c3e-0000-4000-8000-000000000001', '/index.html'])(
    'answers %s with index.html, to be revalidated on every use',
    async (path) => {
      const response = await request(app).get(path).set('Accept', 'text/html');
      expect(response.status).toBe(200);
      // RFC 9111 §5.2.2.4: no-cache lets a cache store it but never use it unrevalidated.
      expect(response.headers['cache-control']).toBe('no-cache');
      expect(response.text).toBe(INDEX_HTML);
    },
  );

  it('revalidates the other root files too', async () => {
    const response = await request(app).get('/gyre-mark.svg');
    expect(response.status).toBe(200);
    expect(response.headers['cache-control']).toBe('no-cache');
  });

  it.each(['text/html', '*/*'])(
    'answers an unknown /assets file with 404, not the page (Accept %s)',
    async (accept) => {
      const response = await request(app).get('/assets/index-Zz99Yy88.js').set('Accept', accept);
      expect(response.status).toBe(404);
      expect(response.text).not.toContain('<title>Gyre</title>');
    },
  );

  it.each(['/assets/index-Ab12Cd34.js.map', '/stray.js.map'])(
    'serves no source map (%s exists on disk)',
    async (path) => {
      const response = await request(app).get(path).set('Accept', '*/*');
      expect(response.status).toBe(404);
      expect(response.text).not.toContain('"version"');
    },
  );

  it('keeps the build manifest private', async () => {
    const response = await request(app).get('/.vite/manifest.json').set('Accept', '*/*');
    expect(response.text).not.toContain('src/main.tsx');
  });

  it('serves fonts with a long cache and a missing font as 404', async () => {
    const font = await request(app).get('/fonts/plex.woff2');
    expect(font.status).toBe(200);
    // RFC 9111 §5.2.2.1: 30 days = 2 592 000 s.
    expect(font.headers['cache-control']).toBe('public, max-age=2592000, immutable');
    const missing = await request(app).get('/fonts/none.woff2').set('Accept', 'text/html');
    expect(missing.status).toBe(404);
  });

  it('leaves /api to the API, even for a browser asking for HTML', async () => {
    const health = await request(app).get('/api/health').set('Accept', 'text/html');
    expect(health.body).toEqual({ status: 'ok' });
    const unknown = await request(app).get('/api/nothing-here').set('Accept', 'text/html');
    expect(unknown.status).toBe(404);
    expect(unknown.text).not.toContain('<title>Gyre</title>');
  });

  it('serves only fonts when the client is not built', async () => {
    const empty = mkdtempSync(join(tmpdir(), 'gyre-no-client-'));
    try {
      const fontsDir = join(empty, 'fonts');
      mkdirSync(fontsDir);
      const bare = express();
      expect(serveClient(bare, { clientDir: join(empty, 'dist'), fontsDir })).toEqual({
        clientBuilt: false,
      });
      expect((await request(bare).get('/').set('Accept', 'text/html')).status).toBe(404);
    } finally {
      rmSync(empty, { recursive: true, force: true });
    }
  });
});
