'use strict';
// Entry of the worker threads when the server runs from TypeScript source (jest): `.ts` is
// compiled on require (register-typescript.cjs), then the real worker module loads. Built
// code never uses this file: `worker-file.ts` points piscina at dist/.../analysis.worker.js.
require('./register-typescript.cjs');

module.exports = require('./analysis.worker.ts');
