// `npm run backup` / `npm run restore -- <file> [database]`: pg_dump -Fc and pg_restore.
// Row-level security is forced even for the owner, so a dump needs a superuser or a BYPASSRLS role:
// BACKUP_DATABASE_URL, or locally the cluster's postgres superuser over its socket.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fail, log, postgresBinDir, root } from './lib/bootstrap.mjs';

const [command, ...args] = process.argv.slice(2);
const bin = postgresBinDir() ?? '/usr/bin';
const url = new URL(process.env.BACKUP_DATABASE_URL ?? `postgres://postgres@localhost:54320/burrowline?host=${path.join(root, '.data', 'pg-start-socket')}`);

function tool(name, toolArgs) {
  const result = spawnSync(path.join(bin, name), toolArgs, { stdio: ['ignore', 'inherit', 'inherit'] });
  if (result.status !== 0) fail(`${name} failed (exit ${result.status})`);
}

function urlFor(database) {
  const copy = new URL(url);
  copy.pathname = `/${database}`;
  return copy.toString();
}

if (command === 'backup') {
  const dir = path.join(root, '.data', 'backups');
  fs.mkdirSync(dir, { recursive: true });
  const file = args[0] ?? path.join(dir, `burrowline-${new Date().toISOString().replace(/[:.]/g, '-')}.dump`);
  tool('pg_dump', ['--format=custom', '--file', file, url.toString()]);
  log(`backup written: ${file}`);
} else if (command === 'restore') {
  const [file, database = `burrowline_restored_${Date.now()}`] = args;
  if (!file || !fs.existsSync(file)) fail('usage: npm run restore -- <dump file> [new database name]');
  if (!/^[a-z_][a-z0-9_]*$/.test(database)) fail('the database name may use a-z, 0-9 and _ only');
  tool('psql', [url.toString(), '-v', 'ON_ERROR_STOP=1', '-qc', `CREATE DATABASE ${database} OWNER burrowline_owner`]);
  tool('pg_restore', ['--exit-on-error', '--dbname', urlFor(database), file]);
  log(`restored into database ${database}`);
} else {
  fail('usage: node scripts/backup.mjs backup [file] | restore <file> [database]');
}
