import path from 'node:path';
import { defineConfig } from 'vitest/config';

const root = path.resolve(__dirname);

export default defineConfig({
  resolve: {
    alias: {
      '@': root,
      // 'server-only' throws outside React Server Components; our tests run server code directly.
      'server-only': path.join(root, 'tests/fixtures/server-only.ts'),
    },
  },
  test: {
    environment: 'node',
    pool: 'forks',
    maxWorkers: 2,
    projects: [
      {
        extends: true,
        // Property tests run hundreds of cases; on a busy 2-core machine 5 s is too tight.
        test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], testTimeout: 20_000 },
      },
      {
        extends: true,
        test: {
          name: 'integration',
          include: ['tests/integration/**/*.test.ts'],
          // One database for all integration files: run them one at a time.
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
    ],
    coverage: {
      provider: 'v8',
      include: ['lib/viticulture/**/*.ts'],
      reporter: ['text-summary', 'text'],
      thresholds: { 'lib/viticulture/**': { lines: 95 } },
    },
  },
});
