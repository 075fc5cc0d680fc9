import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    include: ['src/**/*.test.ts'],
    // Statistical checks draw millions of numbers; on a busy 2-core machine they need more than 5 s.
    testTimeout: 30_000,
  },
});
