// For working on tests: `node scripts/test-infra.mjs <name> <pgPort> <smtpPort> <mailWebPort>` starts a
// fresh cluster, maildev and the fake card service (`[cardPort]`, default 12112) that stay up, migrated
// and seeded, and prints the env to source.
import fs from 'node:fs';
import path from 'node:path';
import { fakeCardEnv, root, runTs, startCluster, startFakeCardService, startMaildev } from './lib/bootstrap.mjs';

const [name = 'pg-work', pg = '54331', smtp = '1036', web = '1091', card = '12112'] = process.argv.slice(2);
const cluster = await startCluster({ name, port: Number(pg), fresh: true, fast: true });
await startMaildev({ smtpPort: Number(smtp), webPort: Number(web) });
await startFakeCardService({ port: Number(card) });
const env = {
  NODE_ENV: 'test', PG_CLUSTER_NAME: name, DATABASE_URL: cluster.appUrl, DATABASE_OWNER_URL: cluster.ownerUrl,
  SESSION_SECRET: 'test-secret-test-secret-test-secret-0123', SMTP_HOST: '127.0.0.1', SMTP_PORT: smtp,
  MAILDEV_API: `http://127.0.0.1:${web}`, CHROMIUM_PATH: '/usr/bin/chromium', LOG_LEVEL: 'silent', ...fakeCardEnv(Number(card)),
};
runTs('packages/server/src/db/migrate-cli.ts', ['up'], env);
runTs('seed/load.ts', [], env);
const file = path.join(root, '.data', `${name}.env`);
fs.writeFileSync(file, Object.entries(env).map(([k, v]) => `export ${k}=${v}`).join('\n') + '\n');
console.log(`ready: source ${file}   (maildev stays up while this process runs)`);
