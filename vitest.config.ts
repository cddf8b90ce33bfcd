import os from 'node:os';
import { defineConfig } from 'vitest/config';

// An API test spends most of its time waiting on PostgreSQL, so one worker more than there are cores keeps
// them busy (vitest's default, cores − 1, is a single worker on a two-core machine). The browser tests run
// one file at a time after the rest.
const workers = os.availableParallelism() + 1;

const apiSettings = {
  globalSetup: ['test/support/global-setup.ts'],
  // Queued e-mail is sent by the run's one worker (test/support/global-setup.ts), not by test processes.
  env: { MAIL_WORKER: 'false', MAIL_POLL_SECONDS: '0.5' },
  testTimeout: 30_000,
  hookTimeout: 30_000,
  pool: 'forks' as const,
};
/** Point their process at another database, so each keeps a process of its own. */
const ownProcessFiles = ['test/api/database-down.test.ts', 'test/api/several-instances.test.ts'];

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
          env: { MAIL_WORKER: 'false', MAIL_POLL_SECONDS: '0.5' },
          testTimeout: 90_000,
          hookTimeout: 60_000,
          fileParallelism: false,
          pool: 'forks',
        },
      },
    ],
  },
});
