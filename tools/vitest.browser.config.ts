import { defineConfig } from 'vitest/config';

// Browser end-to-end tests: Debian's Chromium driven by playwright-core against the running app.
export default defineConfig({
  test: {
    include: ['e2e/**/*.browser.ts'],
    fileParallelism: false,
    testTimeout: 60_000,
    hookTimeout: 60_000,
  },
});
