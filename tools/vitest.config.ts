import { defineConfig } from 'vitest/config';

// CLI and benchmark-helper tests. They use @quietglass/shared as users do (its built dist), so the
// global setup builds the shared workspace once first. Browser tests have their own config.
export default defineConfig({
  test: {
    include: ['calc/**/*.test.ts', 'bench/**/*.test.ts', 'lib/**/*.test.ts'],
    globalSetup: ['./calc/build-shared.setup.ts'],
    testTimeout: 120_000,
  },
});
