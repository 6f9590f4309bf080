import { defineConfig } from 'vitest/config';

/** End-to-end tests: the built app on a real server, driven in Debian's Chromium. */
export default defineConfig({
  test: {
    environment: 'node',
    include: ['e2e/**/*.e2e.ts'],
    testTimeout: 120_000,
    hookTimeout: 180_000,
    fileParallelism: false,
  },
});
