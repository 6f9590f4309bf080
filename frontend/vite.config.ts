import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';

const backend = `http://127.0.0.1:${process.env.GYRE_API_PORT ?? '3000'}`;

export default defineConfig({
  plugins: [react()],
  // The shared package is CommonJS (it serves Nest too); let the bundler convert it.
  optimizeDeps: {
    include: ['@gyre/shared', '@gyre/shared/channel-labels', '@gyre/shared/palette'],
  },
  server: {
    port: 5173,
    proxy: { '/api': backend },
  },
  build: {
    outDir: 'dist',
    // No source maps in the served build: they would publish the whole source.
    sourcemap: false,
    // .vite/manifest.json: which built file holds which module (the first-load e2e test reads
    // it; the server never sends it).
    manifest: true,
    // The chart library is one chunk of about 1.6 MB, fetched only by chart screens.
    chunkSizeWarningLimit: 1700,
  },
  test: {
    environment: 'jsdom',
    globals: true,
    setupFiles: ['./src/test/setup.ts'],
    include: ['src/**/*.test.{ts,tsx}'],
    css: false,
    // antd's forms and tables render slowly in jsdom on a 2-core machine.
    testTimeout: 30_000,
  },
});
