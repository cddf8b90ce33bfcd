import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type NonAttribute, type Sequelize } from 'sequelize';
import type { TemperatureUnit, WeightUnit } from '@burrowline/shared';
import type { User } from '../users/user.model';
import { DEFAULT_FARM_TIME_ZONE } from './farm-defaults';

export class Farm extends Model<InferAttributes<Farm>, InferCreationAttributes<Farm>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare name: string;
  declare location: CreationOptional<string>;
  declare timeZone: CreationOptional<string>;
  declare weightUnit: CreationOptional<WeightUnit>;
  declare temperatureUnit: CreationOptional<TemperatureUnit>;
  declare breedsKept: CreationOptional<string[]>;
  declare description: CreationOptional<string>;
  declare latitude: CreationOptional<number | null>;
  declare longitude: CreationOptional<number | null>;
  declare sharesGetRecords: CreationOptional<boolean>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;
  declare members?: NonAttribute<User[]>;

  static initModel(sequelize: Sequelize) {
    Farm.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        location: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        timeZone: { type: DataTypes.TEXT, allowNull: false, defaultValue: DEFAULT_FARM_TIME_ZONE },
        weightUnit: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'lb_oz' },
        temperatureUnit: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'F' },
        breedsKept: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
        description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        latitude: { type: DataTypes.DOUBLE, allowNull: true },
        longitude: { type: DataTypes.DOUBLE, allowNull: true },
        sharesGetRecords: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'farms', underscored: true, version: true, paranoid: true },
    );
  }
}
