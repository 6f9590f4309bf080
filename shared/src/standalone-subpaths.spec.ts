import { readFileSync } from 'node:fs';
import { join } from 'node:path';

/**
 * The package's subpaths other than its main entry (package.json "exports") load nothing else:
 * the signal core and the sign-in page take them without the rest of `@gyre/shared` and its
 * chart packages (common practice for a dependency-free entry point).
 */
const PACKAGE_ROOT = join(__dirname, '..');
const exportsField = (
  JSON.parse(readFileSync(join(PACKAGE_ROOT, 'package.json'), 'utf8')) as {
    exports: Record<string, string | { default: string }>;
  }
).exports;

const standalone = Object.entries(exportsField).flatMap(([subpath, target]) =>
  subpath === '.' || typeof target === 'string' ? [] : [[subpath, target.default] as const],
);

/** Every `import`, `export … from` and `require(` in a source text. */
const MODULE_REFERENCE = /^\s*import[\s{*'"]|\bfrom\s+['"]|\brequire\s*\(|\bimport\s*\(/m;

describe('standalone subpaths of @gyre/shared', () => {
  it('are the label rules and the palette', () => {
    expect(standalone.map(([subpath]) => subpath)).toEqual(['./channel-labels', './palette']);
  });

  it('tells an import from plain code', () => {
    expect(MODULE_REFERENCE.test("import { ticks } from 'd3-array';")).toBe(true);
    expect(MODULE_REFERENCE.test("export * from './api';")).toBe(true);
    expect(MODULE_REFERENCE.test("const x = require('d3-scale');")).toBe(true);
    expect(MODULE_REFERENCE.test("const name = 'imported from the file';")).toBe(false);
  });

  it.each(standalone)('%s imports nothing', (_subpath, built) => {
    const source = join(PACKAGE_ROOT, built.replace(/^\.\/dist\//, 'src/').replace(/\.js$/, '.ts'));
    expect(MODULE_REFERENCE.test(readFileSync(source, 'utf8'))).toBe(false);
  });
});
