import { ConnectionError, Sequelize } from 'sequelize';
import { isLostConnection } from './database-errors';
import { openTenantTransactionsWithFirstStatement } from './tenant-opening';

let instance: { url: string; sequelize: Sequelize } | null = null;

/**
 * Opens the process's one connection pool, as the app role (never the owner). The composition root
 * passes `initModels`, so this folder never imports the modules.
 */
export function openDatabase(url: string, poolMax: number, initModels: (sequelize: Sequelize) => void): Sequelize {
  if (instance?.url === url) return instance.sequelize;
  if (instance) throw new Error('connectDatabase was called with a second database URL');
  const sequelize = new Sequelize(url, {
    dialect: 'postgres',
    logging: false,
    pool: { max: poolMax, min: 0, idle: 10_000, acquire: 30_000 },
    define: { underscored: true },
    // Only a lost connection is worth a second try of one query; any other failure would be retried inside an
    // aborted transaction ("current transaction is aborted") and hide the real error. Whole transactions are
    // run again in withTenant. The arrow function is called as a predicate (it has no prototype to match).
    retry: { max: 3, match: [ConnectionError, (error: unknown) => isLostConnection(error)] },
  });
  openTenantTransactionsWithFirstStatement(sequelize);
  initModels(sequelize);
  instance = { url, sequelize };
  return sequelize;
}

export function database(): Sequelize {
  if (!instance) throw new Error('The database is not connected yet');
  return instance.sequelize;
}

export async function closeDatabase(): Promise<void> {
  if (!instance) return;
  const { sequelize } = instance;
  instance = null;
  await sequelize.close();
}
