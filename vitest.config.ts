import { defineConfig } from 'vitest/config';

export default defineConfig({
  test: {
    projects: [
      { test: { name: 'unit', include: ['packages/*/src/**/*.test.ts'], environment: 'node' } },
      {
        test: {
          name: 'api',
          include: ['test/api/**/*.test.ts'],
          globalSetup: ['test/support/global-setup.ts'],
          // Queued e-mail leaves within half a second, so tests that wait for it stay quick.
          env: { MAIL_POLL_SECONDS: '0.5' },
          testTimeout: 30_000,
          hookTimeout: 30_000,
          pool: 'forks',
        },
      },
      { test: { name: 'reference', include: ['test/reference/**/*.test.ts'] } },
      {
        test: {
          name: 'e2e',
          include: ['test/e2e/**/*.test.ts'],
          globalSetup: ['test/support/global-setup.ts'],
          env: { MAIL_POLL_SECONDS: '0.5' },
          testTimeout: 90_000,
          hookTimeout: 60_000,
          fileParallelism: false,
          pool: 'forks',
        },
      },
    ],
  },
});
