// One ESLint configuration for every workspace (flat config, ESLint 10).
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import prettier from 'eslint-config-prettier';
import globals from 'globals';
import { readdirSync } from 'node:fs';

// Import boundaries (core `no-restricted-imports`, no plugin).
// 1. Nothing outside backend/ reaches into the server's sources or build: only its package
//    entry points (`@gyre/backend/signal`, …) are public.
const backendInternals = {
  regex: String.raw`(^|/)backend/(src|dist)(/|$)|^@gyre/backend/(src|dist)(/|$)`,
  message: 'Import the public entry (e.g. @gyre/backend/signal), not backend/src or backend/dist.',
};
// 2. In the client a feature (frontend/src/features/X) never imports another feature; what two
//    features share lives in frontend/src/components or frontend/src/lib. The rule sees the
//    import text only, so there is one block per feature and folder depth: from a file `depth`
//    folders below features/X, `'../'.repeat(depth)` is features/ itself.
const featureRoot = 'frontend/src/features';
const features = readdirSync(new URL(featureRoot, import.meta.url), { withFileTypes: true })
  .filter((entry) => entry.isDirectory())
  .map((entry) => entry.name);
const featureBoundaries = features.flatMap((feature) =>
  [1, 2, 3, 4].map((depth) => ({
    files: [`${featureRoot}/${feature}/${'*/'.repeat(depth - 1)}*.{ts,tsx}`],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            backendInternals,
            {
              regex: String.raw`^(\.\./){${depth}}(?!${feature}/)[^./][^/]*(/|$)|(^|/)features/(?!${feature}/)`,
              message: `A feature does not import another feature: move what ${feature} shares to frontend/src/components or frontend/src/lib.`,
            },
          ],
        },
      ],
    },
  })),
);

export default tseslint.config(
  {
    ignores: [
      '**/node_modules/**',
      '**/dist/**',
      'data/**',
      'test-results/**',
      'coverage/**',
      'fonts/**',
      'backend/test/fixtures/**',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node } },
    rules: {
      '@typescript-eslint/no-explicit-any': 'error',
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_' },
      ],
      eqeqeq: ['error', 'always'],
    },
  },
  {
    // Type-aware promise checks for every workspace (backend, shared, frontend, seed): a promise
    // nobody awaits or handles loses its error; one passed where a void callback is expected
    // (an Express handler, an event listener) is never awaited.
    files: ['**/*.{ts,tsx}'],
    languageOptions: {
      parserOptions: { projectService: true, tsconfigRootDir: import.meta.dirname },
    },
    rules: {
      '@typescript-eslint/no-floating-promises': 'error',
      '@typescript-eslint/no-misused-promises': 'error',
    },
  },
  {
    ignores: ['backend/**'],
    rules: { 'no-restricted-imports': ['error', { patterns: [backendInternals] }] },
  },
  {
    // The shared client pieces stand below every feature.
    files: ['frontend/src/components/**/*.{ts,tsx}', 'frontend/src/lib/**/*.{ts,tsx}'],
    rules: {
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            backendInternals,
            {
              regex: String.raw`(^|/)features/`,
              message: 'Shared components and lib do not import a feature.',
            },
          ],
        },
      ],
    },
  },
  ...featureBoundaries,
  {
    files: ['backend/**/*.ts'],
    rules: {
      // Nest injects by constructor parameter types: type-only imports would erase them.
      '@typescript-eslint/consistent-type-imports': 'off',
    },
  },
  {
    files: ['frontend/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { 'react-hooks': reactHooks },
    rules: { ...reactHooks.configs.recommended.rules },
  },
  {
    files: ['**/*.cjs', '**/jest.config.js'],
    languageOptions: { sourceType: 'commonjs' },
    rules: { '@typescript-eslint/no-require-imports': 'off' },
  },
  prettier,
);
