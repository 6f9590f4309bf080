'use strict';
// Entry of the report-rendering thread when the server runs from TypeScript source (jest).
// Compiles `.ts` on require with @swc/core, then loads the worker module; built code loads
// dist/report-document/render.worker.js directly (see report-renderer.ts).
const { readFileSync } = require('node:fs');
const swc = require('@swc/core');

if (!require.extensions['.ts']) {
  require.extensions['.ts'] = function compileTypeScript(module, filename) {
    const { code } = swc.transformSync(readFileSync(filename, 'utf8'), {
      filename,
      jsc: { parser: { syntax: 'typescript' }, target: 'es2022' },
      module: { type: 'commonjs' },
      sourceMaps: 'inline',
    });
    module._compile(code, filename);
  };
}

module.exports = require('./render.worker.ts');
