import { defineConfig } from 'vitest/config';

// Tests are TypeScript sources under test/; compiled copies under dist/ are never collected.
// The JSON results (test-output/, git-ignored) let .ci/run print one plain "N passed, N failed" line.
export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    exclude: ['dist/**', 'node_modules/**'],
    testTimeout: 60_000,
    hookTimeout: 120_000,
    reporters: ['default', ['json', { outputFile: 'test-output/vitest-results.json' }]],
  },
});
