// `npm run dev`: the same services as `npm start`, then Vite with HMR proxied to an API that restarts on change.
import path from 'node:path';
import {
  ensureNodeModules, fakeCardEnv, localSecret, log, onShutdown, root, runTs, startChild, startCluster, startFakeCardService, startMaildev,
} from './lib/bootstrap.mjs';

ensureNodeModules();
const cluster = await startCluster({ name: 'pg-start', port: 54320 });
onShutdown(() => cluster.stop());
const env = {
  NODE_ENV: 'development',
  DATABASE_URL: cluster.appUrl,
  DATABASE_OWNER_URL: cluster.ownerUrl,
  PORT: '3000',
  APP_URL: 'http://127.0.0.1:5173',
  SESSION_SECRET: localSecret('session'),
  SMTP_HOST: '127.0.0.1',
  SMTP_PORT: '1025',
  ...fakeCardEnv(12111, localSecret('card-webhook')),
};
await startMaildev({ smtpPort: 1025, webPort: 1080 });
await startFakeCardService({ port: 12111, accounts: [{ apiKey: env.STRIPE_SECRET_KEY, webhookSecret: env.STRIPE_WEBHOOK_SECRET, webhookUrl: 'http://127.0.0.1:3000/api/card-webhooks' }] });
runTs('packages/server/src/db/migrate-cli.ts', ['up'], env);
runTs('seed/load.ts', ['--if-empty'], env);
startChild('api', process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), 'watch', path.join(root, 'packages/server/src/server.ts')], {
  env: { ...process.env, ...env },
});
startChild('vite', process.execPath, [path.join(root, 'node_modules/vite/bin/vite.js'), '--host', '127.0.0.1'], {
  cwd: path.join(root, 'packages/client'),
});
log('dev: http://127.0.0.1:5173 (API on :3000, mail on http://127.0.0.1:1080)');
