import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { ErrorKind, GyreException } from './gyre.exception';
import { HttpExceptionFilter, STATUS_FOR_KIND } from './http-exception.filter';

const SRC = join(__dirname, '..', '..');

function filesUnder(dir: string, suffix: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory())
      return name === 'node_modules' ? [] : filesUnder(path, suffix);
    return path.endsWith(suffix) ? [path] : [];
  });
}

interface ErrorModule {
  file: string;
  enumName: string;
  codes: Record<string, string>;
  kinds: Record<string, ErrorKind>;
}

/** Every `*.errors.ts` of the backend: its enum of codes and its one map of kinds. */
const modules: ErrorModule[] = filesUnder(SRC, '.errors.ts').map((file) => {
  const exports = require(file) as Record<string, unknown>; // eslint-disable-line @typescript-eslint/no-require-imports
  const enumName = Object.keys(exports).find((name) => /^[A-Z]\w*Error$/.test(name));
  const mapName = Object.keys(exports).find((name) => /^[A-Z_]+_ERROR_KINDS$/.test(name));
  if (enumName === undefined || mapName === undefined) {
    throw new Error(`${relative(SRC, file)}: expected an XError enum and an X_ERROR_KINDS map`);
  }
  return {
    file: relative(SRC, file),
    enumName,
    codes: exports[enumName] as Record<string, string>,
    kinds: exports[mapName] as Record<string, ErrorKind>,
  };
});

describe('error codes → kinds → HTTP status', () => {
  it('finds every module of codes (one enum and one map per *.errors.ts)', () => {
    expect(modules.length).toBeGreaterThanOrEqual(20);
    expect(modules.map((m) => m.file)).toEqual(
      expect.arrayContaining(['auth/auth.errors.ts', 'signoff/signoff.errors.ts']),
    );
  });

  it.each(modules.map((m) => [m.file, m] as const))(
    '%s: every code has exactly one kind, and every kind a 4xx/5xx status',
    (_file, m) => {
      const codes = Object.values(m.codes);
      expect(codes.length).toBeGreaterThan(0);
      expect(Object.keys(m.kinds).sort()).toEqual([...codes].sort());
      for (const code of codes) {
        expect(Object.values(ErrorKind)).toContain(m.kinds[code]);
        const status: number = STATUS_FOR_KIND[m.kinds[code]];
        expect(status >= 400 && status < 600).toBe(true);
      }
    },
  );

  it('gives no two modules the same code (clients switch on the code alone)', () => {
    const all = modules.flatMap((m) => Object.values(m.codes));
    expect(new Set(all).size).toBe(all.length);
  });

  it('the statuses of RFC 9110 §15 for every kind', () => {
    expect(STATUS_FOR_KIND).toEqual({
      [ErrorKind.BadInput]: 400,
      [ErrorKind.Unprocessable]: 422,
      [ErrorKind.Unauthenticated]: 401,
      [ErrorKind.Forbidden]: 403,
      [ErrorKind.NotFound]: 404,
      [ErrorKind.Conflict]: 409,
      [ErrorKind.PayloadTooLarge]: 413,
      [ErrorKind.TooManyRequests]: 429,
      [ErrorKind.Locked]: 423, // RFC 4918 §11.3
      [ErrorKind.Unavailable]: 503,
    });
  });

  it('a wrong password is 422 at sign-in, password change and signing alike', () => {
    const kindOf = (code: string): ErrorKind | undefined =>
      modules.find((m) => code in m.kinds)?.kinds[code];
    for (const code of [
      'AUTH_WRONG_CREDENTIALS',
      'AUTH_CURRENT_PASSWORD_WRONG',
      'SIGNOFF_WRONG_PASSWORD',
    ]) {
      expect(kindOf(code)).toBe(ErrorKind.Unprocessable);
    }
  });

  // Every module throws through its factory, so a code's kind is written once: a throw site
  // that names a kind next to a module's code could disagree with the map.
  it('no source file pairs `new GyreException(ErrorKind.K, …)` with a module code', () => {
    const site = /new GyreException\(\s*ErrorKind\.(\w+),\s*(\w+Error)\.(\w+),/g;
    const named: string[] = [];
    let files = 0;
    for (const file of filesUnder(SRC, '.ts').filter((f) => !f.endsWith('.spec.ts'))) {
      files += 1;
      for (const [, , enumName, member] of readFileSync(file, 'utf8').matchAll(site)) {
        named.push(`${relative(SRC, file)}: ${enumName}.${member}`);
      }
    }
    // The walk saw the source tree (a wrong root would prove nothing).
    expect(files).toBeGreaterThan(200);
    expect(named).toEqual([]);
  });

  it('the filter answers each kind with its status and the code as thrown', () => {
    const filter = new HttpExceptionFilter();
    for (const kind of Object.values(ErrorKind)) {
      let sent: { status?: number; body?: unknown } = {};
      const response = {
        headersSent: false,
        status(status: number) {
          sent = { ...sent, status };
          return this;
        },
        json(body: unknown) {
          sent = { ...sent, body };
          return this;
        },
      };
      const host = { switchToHttp: () => ({ getResponse: () => response }) };
      filter.catch(new GyreException(kind, 'SOME_CODE', 'message', { field: 'x' }), host as never);
      expect(sent).toEqual({
        status: STATUS_FOR_KIND[kind],
        body: {
          statusCode: STATUS_FOR_KIND[kind],
          code: 'SOME_CODE',
          message: 'message',
          details: { field: 'x' },
        },
      });
    }
  });
});
