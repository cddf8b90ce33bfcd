import os from 'node:os';
import { defineConfig } from 'vitest/config';

// An API test spends most of its time waiting on PostgreSQL, so one worker more than there are cores keeps
// them busy (vitest's default, cores − 1, is a single worker on a two-core machine). The browser tests run
// one file at a time after the rest.
const workers = os.availableParallelism() + 1;

export default defineConfig({
  test: {
    maxWorkers: workers,
    projects: [
      // Pure code with no module state: one worker runs file after file without re-importing.
      // The deepest pedigree checks take seconds, more while API workers share the cores.
      { test: { name: 'unit', include: ['packages/*/src/**/*.test.ts'], environment: 'node', pool: 'threads', isolate: false, testTimeout: 30_000 } },
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
      { test: { name: 'reference', include: ['test/reference/**/*.test.ts'], pool: 'threads', isolate: false } },
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
