'use strict';
// Entry of the report-rendering thread when the server runs from TypeScript source (jest).
// Compiles `.ts` on require with @swc/core, then loads the worker module; built code loads
// dist/report-document/render.worker.js directly (see report-renderer.ts).
require('../jobs/worker/register-typescript.cjs');

module.exports = require('./render.worker.ts');
