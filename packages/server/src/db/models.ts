import type { Sequelize } from 'sequelize';
import { AuditEvent } from '../modules/audit/audit-event.model';
import { RecordChange } from '../modules/audit/record-change.model';
import { OneTimeToken } from '../modules/auth/one-time-token.model';
import { Cooperative } from '../modules/coops/coop.model';
import { Farm } from '../modules/farms/farm.model';
import { User } from '../modules/users/user.model';

/** Initialises every model and association once per connection. */
export function initModels(sequelize: Sequelize): void {
  for (const model of [Cooperative, Farm, User, AuditEvent, RecordChange, OneTimeToken]) model.initModel(sequelize);
  Farm.hasMany(User, { as: 'members', foreignKey: 'farmId' });
  User.belongsTo(Farm, { as: 'farm', foreignKey: 'farmId' });
}
