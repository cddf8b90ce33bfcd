import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { BreedingCheck, ServiceStatus } from '@burrowline/shared';

/** A service: a doe bred to a buck on a date, open until kindled, palpated empty or closed as missed. */
export class ServiceRecord extends Model<InferAttributes<ServiceRecord>, InferCreationAttributes<ServiceRecord>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare doeId: string;
  declare buckId: string;
  declare servicedOn: string;
  declare notes: CreationOptional<string>;
  declare status: CreationOptional<ServiceStatus>;
  declare closedOn: CreationOptional<string | null>;
  declare closeReason: CreationOptional<string | null>;
  declare litterId: CreationOptional<string | null>;
  declare warnings: CreationOptional<BreedingCheck[]>;
  declare recordedBy: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    ServiceRecord.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        doeId: { type: DataTypes.UUID, allowNull: false },
        buckId: { type: DataTypes.UUID, allowNull: false },
        servicedOn: { type: DataTypes.DATEONLY, allowNull: false },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'open' },
        closedOn: { type: DataTypes.DATEONLY, allowNull: true },
        closeReason: { type: DataTypes.TEXT, allowNull: true },
        litterId: { type: DataTypes.UUID, allowNull: true },
        warnings: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        recordedBy: { type: DataTypes.UUID, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'services', underscored: true, version: true, paranoid: true },
    );
  }
}
