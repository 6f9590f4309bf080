/** @type {import('jest').Config} */
const swc = [
  '@swc/jest',
  {
    jsc: {
      parser: { syntax: 'typescript', decorators: true },
      transform: { legacyDecorator: true, decoratorMetadata: true },
      target: 'es2022',
    },
    module: { type: 'commonjs' },
  },
];

module.exports = {
  testEnvironment: 'node',
  rootDir: '.',
  roots: ['<rootDir>/src', '<rootDir>/test'],
  testRegex: '\\.(spec|e2e-spec)\\.ts$',
  moduleFileExtensions: ['ts', 'js', 'mjs', 'cjs', 'json'],
  transform: {
    '^.+\\.ts$': swc,
    // NestJS 12 ships ESM only: jest needs it as CommonJS.
    '^.+\\.m?js$': swc,
  },
  // So are d3-array, d3-scale and their d3 dependencies (shared/src/chart-ticks.ts).
  transformIgnorePatterns: [
    '/node_modules/(?!(@nestjs|d3-array|d3-scale|internmap|d3-interpolate|d3-color|d3-format|d3-time|d3-time-format)/)',
  ],
  testTimeout: 60000,
};
