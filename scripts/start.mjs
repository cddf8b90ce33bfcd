// `npm start`: installs what is missing, brings up PostgreSQL and maildev, migrates, seeds, builds, serves.
// `npm start -- --instances 3` (or `npm run start:cluster -- 3`): the same with N app instances on one database
// behind a small round-robin proxy on the usual port, live events shared through PostgreSQL and files in a
// local S3 fake, as several instances run in production (docs/deploy.md).
import path from 'node:path';
import {
  buildClient, ensureNodeModules, fakeCardEnv, fakeS3Env, localSecret, log, onShutdown, root, runTs, startChild, startCluster,
  startFakeCardService, startFakeS3, startMaildev, startRoundRobinProxy, waitForHttp,
} from './lib/bootstrap.mjs';

const PORTS = { postgres: 54320, smtp: 1025, mailWeb: 1080, app: 3000, cardService: 12111, s3: 4510 };

/** `--instances N`, `--instances=N`, or a bare number after `--instances` (what `npm run start:cluster -- N` passes). */
function instancesWanted(args) {
  const at = args.findIndex((a) => a === '--instances' || a.startsWith('--instances='));
  if (at === -1) return 1;
  const value = args[at].includes('=') ? args[at].split('=')[1] : args[at + 1];
  const n = value === undefined ? 2 : Number(value);
  if (!Number.isInteger(n) || n < 1 || n > 16) {
    console.error(`--instances wants a whole number from 1 to 16, not ${value}`);
    process.exit(1);
  }
  return n;
}
const instances = instancesWanted(process.argv.slice(2));

ensureNodeModules();

const productionPath = Boolean(process.env.DATABASE_URL && process.env.DATABASE_OWNER_URL);
let cluster = null;
if (!productionPath) {
  cluster = await startCluster({ name: 'pg-start', port: PORTS.postgres });
}
onShutdown(async () => {
  await cluster?.stop();
});

const env = {
  NODE_ENV: process.env.NODE_ENV ?? 'development',
  DATABASE_URL: process.env.DATABASE_URL ?? cluster.appUrl,
  DATABASE_OWNER_URL: process.env.DATABASE_OWNER_URL ?? cluster.ownerUrl,
  PORT: process.env.PORT ?? String(PORTS.app),
  APP_URL: process.env.APP_URL ?? `http://127.0.0.1:${process.env.PORT ?? PORTS.app}`,
  SESSION_SECRET: process.env.SESSION_SECRET ?? localSecret('session'),
  SMTP_HOST: process.env.SMTP_HOST ?? '127.0.0.1',
  SMTP_PORT: process.env.SMTP_PORT ?? String(PORTS.smtp),
};
if (instances > 1) {
  // Every instance must reach every file and hear every live event; the proxy is one hop in front.
  env.REALTIME_ACROSS_INSTANCES = 'true';
  env.TRUST_PROXY_HOPS = process.env.TRUST_PROXY_HOPS ?? '1';
  if (!process.env.STORAGE_DRIVER) {
    Object.assign(env, fakeS3Env(PORTS.s3));
    await startFakeS3({ port: PORTS.s3, dir: path.join(root, '.data', 's3') });
  }
}
if (!process.env.SMTP_HOST) await startMaildev({ smtpPort: PORTS.smtp, webPort: PORTS.mailWeb });
// Card payments go to the local fake unless a real card service is configured.
if (!process.env.STRIPE_SECRET_KEY) {
  // The SDK's scheme: a webhook secret starts with whsec_.
  const card = fakeCardEnv(PORTS.cardService, `whsec_${localSecret('card-webhook')}`);
  Object.assign(env, card);
  await startFakeCardService({
    port: PORTS.cardService,
    accounts: [{ apiKey: card.STRIPE_SECRET_KEY, webhookSecret: card.STRIPE_WEBHOOK_SECRET, webhookUrl: `http://127.0.0.1:${env.PORT}/api/card-webhooks` }],
  });
}

runTs('packages/server/src/db/migrate-cli.ts', ['up'], env);
runTs('seed/load.ts', ['--if-empty'], env);
buildClient();

// One instance listens on PORT itself; several listen on the ports after it, behind the proxy on PORT.
const instancePorts = instances === 1 ? [Number(env.PORT)] : Array.from({ length: instances }, (_, i) => Number(env.PORT) + 1 + i);
for (const [i, port] of instancePorts.entries()) {
  const name = instances === 1 ? 'server' : `instance ${i + 1}`;
  startChild(name, process.execPath, ['--import', 'tsx', path.join(root, 'packages/server/src/server.ts')], {
    env: { ...process.env, ...env, PORT: String(port) },
    onExit: (code) => {
      if (code !== 0 && code !== null) log(`${name} exited with code ${code}`);
    },
  });
}
for (const port of instancePorts) await waitForHttp(`http://127.0.0.1:${port}/api/health`, `the server on :${port}`);
if (instances > 1) {
  await startRoundRobinProxy({ port: Number(env.PORT), upstreams: instancePorts });
  log(`${instances} instances on ${instancePorts.map((p) => `:${p}`).join(' ')} behind the proxy on :${env.PORT}`);
}

log('');
log(`Burrowline is up:  ${env.APP_URL}`);
if (!process.env.SMTP_HOST) log(`Mail inbox:        http://127.0.0.1:${PORTS.mailWeb}`);
if (!process.env.STRIPE_SECRET_KEY) log(`Test card page:    http://127.0.0.1:${PORTS.cardService} (the fake card service)`);
log('Demo accounts (password burrowline-demo): admin@demo.test, member@demo.test, apprentice@demo.test');
log(`Ctrl-C stops the server${instances > 1 ? 's, the proxy, the fake S3' : ''}, the mail server, the fake card service and the database.`);
