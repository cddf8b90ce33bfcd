// `npm test`: a throwaway PostgreSQL cluster and mail server of its own (so it can run beside
// `npm start`), then type check, lint, and every vitest project: unit, API, reference, browser.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import {
  buildClient, CHROMIUM, ensureChromium, ensureNodeModules, log, root, runTs, startCluster, startMaildev, stopChildren,
} from './lib/bootstrap.mjs';

const PORTS = { postgres: 54321, smtp: 1026, mailWeb: 1081 };
const started = Date.now();

ensureNodeModules();
ensureChromium();
const cluster = await startCluster({ name: 'pg-test', port: PORTS.postgres, fresh: true, fast: true });
const cleanup = async () => {
  await stopChildren();
  await cluster.stop();
};
process.on('SIGINT', () => cleanup().then(() => process.exit(130)));
process.on('SIGTERM', () => cleanup().then(() => process.exit(143)));

await startMaildev({ smtpPort: PORTS.smtp, webPort: PORTS.mailWeb });

const env = {
  ...process.env,
  NODE_ENV: 'test',
  PG_CLUSTER_NAME: 'pg-test',
  DATABASE_URL: cluster.appUrl,
  DATABASE_OWNER_URL: cluster.ownerUrl,
  SESSION_SECRET: 'test-secret-test-secret-test-secret-0123',
  SMTP_HOST: '127.0.0.1',
  SMTP_PORT: String(PORTS.smtp),
  MAILDEV_API: `http://127.0.0.1:${PORTS.mailWeb}`,
  CHROMIUM_PATH: CHROMIUM,
  LOG_LEVEL: 'silent',
};
runTs('packages/server/src/db/migrate-cli.ts', ['up'], env);
runTs('seed/load.ts', [], env);
buildClient();

const bin = (name) => path.join(root, 'node_modules', '.bin', name);
const steps = [
  { name: 'type check', command: bin('tsc'), args: ['-p', '.', '--pretty'] },
  { name: 'lint', command: bin('eslint'), args: ['.', '--max-warnings=0'] },
  {
    name: 'tests',
    command: bin('vitest'),
    args: ['run', '--reporter=default', '--reporter=json', '--outputFile.json=.data/vitest-report.json', ...process.argv.slice(2)],
  },
];
const results = [];
for (const step of steps) {
  log(`— ${step.name} —`);
  const t0 = Date.now();
  const result = spawnSync(step.command, step.args, { cwd: root, env, stdio: 'inherit' });
  results.push({ name: step.name, ok: result.status === 0, seconds: (Date.now() - t0) / 1000 });
}
await cleanup();

log('');
for (const r of results) log(`${r.ok ? 'ok  ' : 'FAIL'} ${r.name} (${r.seconds.toFixed(1)} s)`);
const reportFile = path.join(root, '.data', 'vitest-report.json');
if (fs.existsSync(reportFile)) {
  const report = JSON.parse(fs.readFileSync(reportFile, 'utf8'));
  const skipped = report.numPendingTests + report.numTodoTests;
  process.stdout.write(`tests: ${report.numPassedTests} passed, ${report.numFailedTests} failed${skipped ? `, ${skipped} skipped` : ''}\n`);
}
log(`npm test took ${((Date.now() - started) / 1000).toFixed(0)} s`);
process.exit(results.every((r) => r.ok) ? 0 : 1);
