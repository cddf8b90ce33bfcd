// `npm test`: a throwaway PostgreSQL cluster and mail server of its own (so it can run beside
// `npm start`), then type check, lint, and every vitest project: unit, API, reference, browser.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import {
  CHROMIUM, CLIENT_BUILD, ensureChromium, ensureNodeModules, fakeCardEnv, log, root, runTs, startCluster, startFakeCardService, startMaildev, stopChildren,
} from './lib/bootstrap.mjs';

const PORTS = { postgres: 54321, smtp: 1026, mailWeb: 1081, cardService: 12112 };
const started = Date.now();
const vitestArgs = process.argv.slice(2);

/** Runs a step beside others; its output is held back and printed whole, so overlapping steps do not interleave. */
function inBackground(name, command, args, options = {}) {
  const t0 = Date.now();
  return new Promise((resolve) => {
    const child = spawn(command, args, { cwd: root, ...options, stdio: ['ignore', 'pipe', 'pipe'] });
    const output = [];
    child.stdout.on('data', (chunk) => output.push(chunk));
    child.stderr.on('data', (chunk) => output.push(chunk));
    const done = (ok) => resolve({ name, ok, seconds: (Date.now() - t0) / 1000, output: Buffer.concat(output).toString() });
    child.once('error', (error) => {
      output.push(Buffer.from(`${error.message}\n`));
      done(false);
    });
    child.once('close', (code) => done(code === 0));
  });
}

function newestChange(dir) {
  if (!fs.existsSync(dir)) return 0;
  const stat = fs.statSync(dir);
  if (!stat.isDirectory()) return stat.mtimeMs;
  return fs.readdirSync(dir).reduce((newest, entry) => (entry === 'node_modules' || entry === 'dist' ? newest : Math.max(newest, newestChange(path.join(dir, entry)))), 0);
}

/** Only the browser tests serve the built client; it is rebuilt when they run and a source is newer than the build. */
function clientBuildNeeded() {
  const projects = vitestArgs.flatMap((arg, i) => (arg === '--project' ? [vitestArgs[i + 1]] : arg.startsWith('--project=') ? [arg.slice(10)] : []));
  if (projects.length > 0 && !projects.includes('e2e')) return false;
  const built = path.join(CLIENT_BUILD.cwd, 'dist', 'index.html');
  if (!fs.existsSync(built)) return true;
  const sources = [CLIENT_BUILD.cwd, path.join(root, 'packages', 'shared', 'src'), path.join(root, 'package-lock.json')];
  return Math.max(...sources.map(newestChange)) > fs.statSync(built).mtimeMs;
}

ensureNodeModules();
ensureChromium();
const bin = (name) => path.join(root, 'node_modules', '.bin', name);
// None of these needs the database: they run while the cluster starts, migrates and seeds, and type check and
// lint go on beside the tests (each is one process on one core; the tests leave cores idle while they wait).
const clientBuild = clientBuildNeeded()
  ? (log('building the client (in the background)…'), inBackground('client build', CLIENT_BUILD.command, CLIENT_BUILD.args, { cwd: CLIENT_BUILD.cwd }))
  : null;
log('type check and lint (in the background)…');
const checks = [
  // Incremental: a rerun checks only what changed since the last (the file lives in the gitignored data folder).
  inBackground('type check', bin('tsc'), ['-p', '.', '--pretty', '--incremental', '--tsBuildInfoFile', '.data/typecheck.tsbuildinfo']),
  inBackground('lint', bin('eslint'), ['.', '--max-warnings=0']),
];
const cluster = await startCluster({ name: 'pg-test', port: PORTS.postgres, fresh: true, fast: true });
const cleanup = async () => {
  await stopChildren();
  await cluster.stop();
};
process.on('SIGINT', () => cleanup().then(() => process.exit(130)));
process.on('SIGTERM', () => cleanup().then(() => process.exit(143)));
await startMaildev({ smtpPort: PORTS.smtp, webPort: PORTS.mailWeb });
// Each test file's app registers its own account (key, webhook address) with the fake.
await startFakeCardService({ port: PORTS.cardService });

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
  ...fakeCardEnv(PORTS.cardService),
};
runTs('packages/server/src/db/migrate-cli.ts', ['up'], env);
runTs('seed/load.ts', [], env);

// The browser tests serve the built client.
const built = clientBuild ? await clientBuild : null;
if (built) process.stdout.write(built.output.trim() ? `[${built.name}]\n${built.output}` : '');

log('— tests —');
const reportFile = path.join(root, '.data', 'vitest-report.json');
fs.rmSync(reportFile, { force: true }); // a run that dies early must not print the last run's numbers
const t0 = Date.now();
const tests = await new Promise((resolve) => {
  const child = spawn(bin('vitest'), ['run', '--reporter=default', '--reporter=json', '--outputFile.json=.data/vitest-report.json', ...vitestArgs], { cwd: root, env, stdio: 'inherit' });
  child.once('error', () => resolve(1));
  child.once('close', (code) => resolve(code));
});
const results = [...(built ? [built] : []), ...(await Promise.all(checks))];
for (const r of results.slice(built ? 1 : 0)) if (r.output.trim()) process.stdout.write(`[${r.name}]\n${r.output}`);
results.push({ name: 'tests', ok: tests === 0, seconds: (Date.now() - t0) / 1000 });
await cleanup();

log('');
for (const r of results) log(`${r.ok ? 'ok  ' : 'FAIL'} ${r.name} (${r.seconds.toFixed(1)} s)`);
if (fs.existsSync(reportFile)) {
  const report = JSON.parse(fs.readFileSync(reportFile, 'utf8'));
  const skipped = report.numPendingTests + report.numTodoTests;
  process.stdout.write(`tests: ${report.numPassedTests} passed, ${report.numFailedTests} failed${skipped ? `, ${skipped} skipped` : ''}\n`);
  // Where the time goes, so the next slow file is found before the suite outgrows its budget.
  const slowest = report.testResults
    .map((file) => ({ file: path.relative(root, file.name), seconds: (file.endTime - file.startTime) / 1000, tests: file.assertionResults.length }))
    .sort((a, b) => b.seconds - a.seconds)
    .slice(0, 10);
  log('slowest test files:');
  for (const f of slowest) log(`  ${f.seconds.toFixed(1).padStart(6)} s  ${f.file} (${f.tests} tests)`);
}
log(`npm test took ${((Date.now() - started) / 1000).toFixed(0)} s`);
process.exit(results.every((r) => r.ok) ? 0 : 1);
