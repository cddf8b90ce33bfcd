import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { QueryTypes, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';

export interface MigrationContext {
  sql: (statement: string) => Promise<unknown>;
  /** A statement with bound parameters, answering its rows (for migrations that work data out in code). */
  rows: <T>(statement: string, bind: unknown[]) => Promise<T[]>;
  /** The role the app connects as; migrations grant it exactly what it needs. */
  appRole: string;
}
export type MigrationFn = (params: { context: MigrationContext }) => Promise<void>;

const migrationsDir = path.join(path.dirname(fileURLToPath(import.meta.url)), 'migrations');

function roleOf(databaseUrl: string): string {
  const role = decodeURIComponent(new URL(databaseUrl).username);
  if (!/^[a-z_][a-z0-9_]*$/.test(role)) throw new Error(`Unexpected app role name: ${role}`);
  return role;
}

/** Migrations run as the owner role, one transaction per file, recorded in `schema_migrations`. */
export function createMigrator(ownerUrl: string, appUrl: string) {
  const sequelize = new Sequelize(ownerUrl, { dialect: 'postgres', logging: false });
  const appRole = roleOf(appUrl);
  const umzug = new Umzug<MigrationContext>({
    migrations: fs
      .readdirSync(migrationsDir)
      .filter((file) => /^\d{4}-.+\.ts$/.test(file))
      .sort()
      .map((file) => {
        const load = () => import(pathToFileURL(path.join(migrationsDir, file)).href) as Promise<{ up: MigrationFn; down: MigrationFn }>;
        const inTransaction = (direction: 'up' | 'down') => async () => {
          const migration = await load();
          await sequelize.transaction(async (transaction) => {
            const sql = (statement: string) => sequelize.query(statement, { transaction });
            const rows = async <T>(statement: string, bind: unknown[]) =>
              (await sequelize.query(statement, { bind, transaction, type: QueryTypes.SELECT })) as T[];
            await migration[direction]({ context: { sql, rows, appRole } });
          });
        };
        return { name: file.replace(/\.ts$/, ''), up: inTransaction('up'), down: inTransaction('down') };
      }),
    context: { sql: (s: string) => sequelize.query(s), rows: async <T>(s: string, bind: unknown[]) => (await sequelize.query(s, { bind, type: QueryTypes.SELECT })) as T[], appRole },
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  });
  return { umzug, close: () => sequelize.close() };
}
