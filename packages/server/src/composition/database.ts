import type { Sequelize } from 'sequelize';
import { openDatabase } from '../db/sequelize';
import { initModels } from './models';
import { plugModulePorts } from './ports';

export { closeDatabase, database } from '../db/sequelize';

/** One connection pool per process with every model registered and every module port plugged (the app, the seed, tests and benches). */
export function connectDatabase(url: string, poolMax = 10): Sequelize {
  plugModulePorts();
  return openDatabase(url, poolMax, initModels);
}
