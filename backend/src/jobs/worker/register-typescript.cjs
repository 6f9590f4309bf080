'use strict';
// Lets a worker thread started from TypeScript source (jest) require `.ts` files: each is
// compiled on require with @swc/core. The thread entries (ts-worker.cjs here and in
// report-document/) require this first; built code loads dist/**/*.js and never uses it.
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
