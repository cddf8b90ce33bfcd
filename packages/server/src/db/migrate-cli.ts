import { createMigrator } from './migrator';

const [command = 'up'] = process.argv.slice(2);
const ownerUrl = process.env.DATABASE_OWNER_URL;
const appUrl = process.env.DATABASE_URL;
if (!ownerUrl || !appUrl) {
  console.error('DATABASE_OWNER_URL and DATABASE_URL are required to migrate');
  process.exit(1);
}
const { umzug, close } = createMigrator(ownerUrl, appUrl);
try {
  if (command === 'up') {
    const done = await umzug.up();
    console.log(`[burrowline] migrations: ${done.length ? done.map((m) => m.name).join(', ') : 'up to date'}`);
  } else if (command === 'down') {
    const undone = await umzug.down();
    console.log(`[burrowline] reverted: ${undone.map((m) => m.name).join(', ') || 'nothing'}`);
  } else {
    throw new Error(`Unknown command ${command}; use up or down`);
  }
} finally {
  await close();
}
