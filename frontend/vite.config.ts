/// <reference types="vitest/config" />
import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

const apiPort = process.env.QG_API_PORT ?? 3000;

export default defineConfig({
  plugins: [react()],
  resolve: {
    // The client compiles shared's TypeScript sources directly, so it needs no prior build of shared.
    alias: {
      '@quietglass/shared': fileURLToPath(new URL('../shared/src/index.ts', import.meta.url)),
    },
  },
  server: {
    proxy: {
      '/api': { target: `http://127.0.0.1:${apiPort}`, changeOrigin: false },
    },
  },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
  },
  // The preview worker is a module worker (`new Worker(url, { type: 'module' })`).
  worker: { format: 'es' },
  test: {
    environment: 'jsdom',
    include: ['src/**/*.test.{ts,tsx}'],
    setupFiles: ['src/test/setup.ts'],
    // Pages with the data grid take several seconds to load and render in jsdom on a busy machine.
    testTimeout: 30_000,
    restoreMocks: true,
    unstubGlobals: true,
  },
});
