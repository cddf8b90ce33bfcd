import os from 'node:os';
import { defineConfig } from 'vitest/config';

// An API test spends most of its time waiting on PostgreSQL, so one worker more than there are cores keeps
// them busy (vitest's default, cores − 1, is a single worker on a two-core machine). The browser tests run
// one file at a time after the rest.
const workers = os.availableParallelism() + 1;

const apiSettings = {
  globalSetup: ['test/support/global-setup.ts'],
  // Queued e-mail leaves within half a second, so tests that wait for it stay quick.
  env: { MAIL_POLL_SECONDS: '0.5' },
  testTimeout: 30_000,
  hookTimeout: 30_000,
  pool: 'forks' as const,
};
/**
 * Files that keep a process of their own: one points the process at another database, and the ones that
 * wait for e-mail missed a message in one run while sharing a worker with other files (the cause is not
 * yet found: the outbox worker is per process), so they keep the isolation they were written for.
 */
const ownProcessFiles = [
  'test/api/database-down.test.ts',
  ...['almanac-digest', 'applications', 'auth', 'ledger-dues-reminders', 'mail-outbox', 'members', 'sign-in-throttle'].map((name) => `test/api/${name}.test.ts`),
];

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
          exclude: ownProcessFiles,
          ...apiSettings,
          // Files that follow each other in a worker reuse its loaded server modules instead of importing
          // them again (about a third of the suite's CPU time went on imports).
          isolate: false,
        },
      },
      { test: { name: 'api-own-process', include: ownProcessFiles, ...apiSettings } },
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
