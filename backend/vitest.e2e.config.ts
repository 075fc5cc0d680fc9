import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

// e2e specs share one real database and Redis: run files one after another.
export default defineConfig({
  resolve: {
    // Every spec's `supertest` is the client with the CSRF header preset (test/support/request.ts).
    alias: [
      {
        find: /^supertest$/,
        replacement: fileURLToPath(new URL('./test/support/request.ts', import.meta.url)),
      },
    ],
  },
  test: {
    include: ['test/**/*.e2e-spec.ts'],
    globalSetup: ['test/global-setup.ts'],
    fileParallelism: false,
    testTimeout: 30_000,
    hookTimeout: 60_000,
  },
});
