import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'solver',
          include: ['solver/**/*.test.ts', 'test/reference/**/*.test.ts'],
          environment: 'node',
          // Property and robustness tests run thousands of cases: generous on a busy machine.
          testTimeout: 30000,
        },
      },
      {
        test: {
          name: 'api',
          include: ['api/**/*.test.ts', 'test/api/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['test/api/global-setup.ts'],
          fileParallelism: false,
          testTimeout: 20000,
          hookTimeout: 30000,
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['test/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['test/e2e/global-setup.ts'],
          fileParallelism: false,
          testTimeout: 30000,
          hookTimeout: 60000,
          // A page's first load on a busy machine takes seconds: expect.poll's own 1 s is too short.
          expect: { poll: { timeout: 10000 } },
        },
      },
    ],
  },
});
