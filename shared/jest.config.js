/** @type {import('jest').Config} */
const swc = ['@swc/jest', { module: { type: 'commonjs' } }];

// d3-array and d3-scale (and the d3 packages they import) ship ESM only: jest needs them as
// CommonJS. Node itself require()s them at run time.
const D3_ESM = [
  'd3-array',
  'd3-scale',
  'internmap',
  'd3-interpolate',
  'd3-color',
  'd3-format',
  'd3-time',
  'd3-time-format',
];

module.exports = {
  testEnvironment: 'node',
  roots: ['<rootDir>/src'],
  testRegex: '\\.spec\\.ts$',
  transform: { '^.+\\.ts$': swc, '^.+\\.m?js$': swc },
  transformIgnorePatterns: [`/node_modules/(?!(${D3_ESM.join('|')})/)`],
};
