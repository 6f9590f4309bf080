import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import * as ts from 'typescript';

/**
 * The signal core stands alone (common practice for a computational core inside a server):
 * it imports only itself, Node's built-ins, its own numeric packages, the dependency-free
 * 10-10 label rules of `@gyre/shared/channel-labels` and, as types only, the API vocabulary of
 * `@gyre/shared`. Nothing from the rest of the backend, so the seeder,
 * the browser tests and the command line can use it through `@gyre/backend/signal`.
 */
const SIGNAL_ROOT = __dirname;
const PACKAGES = new Set(['fft.js', '@gyre/shared/channel-labels']);
/** Independent decoders and parsers the tests check against (spec files and testing/ only). */
const TEST_PACKAGES = new Set(['edfdecoder', 'typescript']);
const isTestFile = (file: string): boolean =>
  file.endsWith('.spec.ts') || file.split(/[\\/]/).includes('testing');
const TYPE_ONLY_PACKAGES = new Set(['@gyre/shared']);

function sourceFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) return sourceFiles(path);
    return entry.name.endsWith('.ts') ? [path] : [];
  });
}

interface ModuleReference {
  specifier: string;
  typeOnly: boolean;
}

/** Every `import … from`, `export … from`, `import(…)` and `require(…)` of a file. */
function moduleReferences(path: string): ModuleReference[] {
  const source = ts.createSourceFile(
    path,
    readFileSync(path, 'utf8'),
    ts.ScriptTarget.ES2022,
    true,
  );
  const found: ModuleReference[] = [];
  const visit = (node: ts.Node): void => {
    if (ts.isImportDeclaration(node) && ts.isStringLiteral(node.moduleSpecifier)) {
      const clause = node.importClause;
      const namedAllTypes =
        clause?.namedBindings !== undefined &&
        ts.isNamedImports(clause.namedBindings) &&
        clause.name === undefined &&
        clause.namedBindings.elements.length > 0 &&
        clause.namedBindings.elements.every((e) => e.isTypeOnly);
      found.push({
        specifier: node.moduleSpecifier.text,
        typeOnly: clause?.isTypeOnly === true || namedAllTypes,
      });
    } else if (
      ts.isExportDeclaration(node) &&
      node.moduleSpecifier &&
      ts.isStringLiteral(node.moduleSpecifier)
    ) {
      found.push({ specifier: node.moduleSpecifier.text, typeOnly: node.isTypeOnly });
    } else if (
      ts.isCallExpression(node) &&
      (node.expression.kind === ts.SyntaxKind.ImportKeyword ||
        (ts.isIdentifier(node.expression) && node.expression.text === 'require')) &&
      node.arguments.length === 1 &&
      ts.isStringLiteral(node.arguments[0])
    ) {
      found.push({ specifier: node.arguments[0].text, typeOnly: false });
    }
    ts.forEachChild(node, visit);
  };
  visit(source);
  return found;
}

function violation(file: string, ref: ModuleReference): string | null {
  const { specifier } = ref;
  if (specifier.startsWith('.')) {
    const target = relative(SIGNAL_ROOT, resolve(dirname(file), specifier));
    return target.startsWith('..') ? `${specifier} leaves the signal core` : null;
  }
  if (specifier.startsWith('node:') || PACKAGES.has(specifier)) return null;
  if (TEST_PACKAGES.has(specifier) && isTestFile(file)) return null;
  if (TYPE_ONLY_PACKAGES.has(specifier)) {
    return ref.typeOnly ? null : `${specifier} may be imported for types only`;
  }
  return `${specifier} is not a dependency of the signal core`;
}

describe('signal core boundary', () => {
  const files = sourceFiles(SIGNAL_ROOT);

  it('finds the core and reads multi-line imports', () => {
    expect(files.length).toBeGreaterThan(50);
    const index = moduleReferences(join(SIGNAL_ROOT, 'index.ts')).map((r) => r.specifier);
    expect(index).toContain('./pipeline/analyze-recording');
  });

  it('tells a path out of the core and a runtime import of @gyre/shared from allowed ones', () => {
    const file = join(SIGNAL_ROOT, 'pipeline', 'x.ts');
    expect(
      violation(file, { specifier: '../../jobs/worker/worker-tasks', typeOnly: true }),
    ).toMatch(/leaves the signal core/);
    expect(violation(file, { specifier: '../edf', typeOnly: false })).toBeNull();
    expect(violation(file, { specifier: '@gyre/shared', typeOnly: false })).toMatch(/types only/);
    expect(
      violation(file, { specifier: '@gyre/shared/channel-labels', typeOnly: false }),
    ).toBeNull();
    expect(violation(file, { specifier: '@gyre/shared/palette', typeOnly: false })).toMatch(
      /not a dependency/,
    );
    expect(violation(file, { specifier: '@nestjs/common', typeOnly: false })).toMatch(
      /not a dependency/,
    );
    expect(violation(file, { specifier: 'edfdecoder', typeOnly: false })).toMatch(/not a dep/);
    expect(violation(`${file}.spec.ts`, { specifier: 'edfdecoder', typeOnly: false })).toBeNull();
  });

  it('imports nothing from the rest of the backend', () => {
    const problems = files.flatMap((file) =>
      moduleReferences(file).flatMap((ref) => {
        const why = violation(file, ref);
        return why === null ? [] : [`${relative(SIGNAL_ROOT, file)}: ${why}`];
      }),
    );
    expect(problems).toEqual([]);
  });
});
