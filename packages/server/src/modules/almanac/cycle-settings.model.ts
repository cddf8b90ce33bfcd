import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { CycleSettings } from '@burrowline/shared';

/** A farm's own cycle settings (no row: the published defaults). */
export class FarmCycleSettings extends Model<InferAttributes<FarmCycleSettings>, InferCreationAttributes<FarmCycleSettings>> {
  declare farmId: string;
  declare coopId: string;
  declare settings: CycleSettings;
  declare updatedBy: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    FarmCycleSettings.init(
      {
        farmId: { type: DataTypes.UUID, primaryKey: true },
        coopId: { type: DataTypes.UUID, allowNull: false },
        settings: { type: DataTypes.JSONB, allowNull: false },
        updatedBy: { type: DataTypes.UUID, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'farm_cycle_settings', underscored: true, version: true },
    );
  }
}
