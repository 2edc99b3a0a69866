import { defineConfig } from 'vitest/config';

// `npm run test:cluster`: the local Galera cluster behind HAProxy (started here unless `npm run cluster` already runs
// it, and stopped again afterwards if it was started here), one file at a time.
export default defineConfig({
  test: {
    name: 'cluster',
    include: ['tests/cluster/**/*.test.ts'],
    environment: 'node',
    globalSetup: ['tests/cluster/global-setup.ts'],
    setupFiles: ['tests/support/console-trap.ts'],
    fileParallelism: false,
    testTimeout: 300_000,
    hookTimeout: 300_000,
  },
});
