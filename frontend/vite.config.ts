import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';

const backend = `http://127.0.0.1:${process.env.GYRE_API_PORT ?? '3000'}`;

export default defineConfig({
  plugins: [react()],
  // The shared package is CommonJS (it serves Nest too); let the bundler convert it.
  optimizeDeps: { include: ['@gyre/shared'] },
  server: {
    port: 5173,
    proxy: { '/api': backend },
  },
  build: {
    outDir: 'dist',
    sourcemap: true,
    chunkSizeWarningLimit: 1500,
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
