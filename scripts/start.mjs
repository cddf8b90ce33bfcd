// `npm start`: installs what is missing, brings up PostgreSQL and maildev, migrates, seeds, builds, serves.
import path from 'node:path';
import {
  buildClient, ensureNodeModules, fakeCardEnv, localSecret, log, onShutdown, root, runTs, startChild, startCluster,
  startFakeCardService, startMaildev, waitForHttp,
} from './lib/bootstrap.mjs';

const PORTS = { postgres: 54320, smtp: 1025, mailWeb: 1080, app: 3000, cardService: 12111 };

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

startChild('server', process.execPath, ['--import', 'tsx', path.join(root, 'packages/server/src/server.ts')], {
  env: { ...process.env, ...env },
  onExit: (code) => {
    if (code !== 0 && code !== null) log(`the server exited with code ${code}`);
  },
});
await waitForHttp(`http://127.0.0.1:${env.PORT}/api/health`, 'the server');

log('');
log(`Burrowline is up:  ${env.APP_URL}`);
if (!process.env.SMTP_HOST) log(`Mail inbox:        http://127.0.0.1:${PORTS.mailWeb}`);
if (!process.env.STRIPE_SECRET_KEY) log(`Test card page:    http://127.0.0.1:${PORTS.cardService} (the fake card service)`);
log('Demo accounts (password burrowline-demo): admin@demo.test, member@demo.test, apprentice@demo.test');
log('Ctrl-C stops the server, the mail server, the fake card service and the database.');
