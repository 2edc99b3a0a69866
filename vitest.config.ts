import { defineConfig } from 'vitest/config';

// Three projects: pure unit tests, API tests against a throwaway MariaDB, and browser journeys in Debian Chromium.
export default defineConfig({
  test: {
    coverage: {
      provider: 'v8',
      include: ['shared/domain/**/*.ts'],
      reporter: ['text-summary', 'text'],
    },
    projects: [
      {
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
          setupFiles: ['tests/support/console-trap.ts'],
        },
      },
      {
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/global-setup-db.ts'],
          setupFiles: ['tests/support/console-trap.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/global-setup-db.ts', 'tests/support/global-setup-app.ts'],
          setupFiles: ['tests/support/console-trap.ts'],
          fileParallelism: false,
          testTimeout: 90_000,
          hookTimeout: 120_000,
        },
      },
    ],
  },
});
