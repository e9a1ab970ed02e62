import { defineConfig } from 'vitest/config';

// Tests are TypeScript sources under test/; compiled copies under dist/ are never collected.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    exclude: ['dist/**', 'node_modules/**'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
  },
});
