import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Disposition, Lifecycle } from '@burrowline/shared';

/** A dated change of lifecycle or disposition; the animal row holds the current value. */
export class AnimalStatusEvent extends Model<InferAttributes<AnimalStatusEvent>, InferCreationAttributes<AnimalStatusEvent>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare animalId: string;
  declare farmId: string | null;
  declare kind: 'lifecycle' | 'disposition';
  declare value: Lifecycle | Disposition;
  declare cause: string | null;
  declare effectiveOn: string;
  declare recordedBy: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    AnimalStatusEvent.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        animalId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: true },
        kind: { type: DataTypes.TEXT, allowNull: false },
        value: { type: DataTypes.TEXT, allowNull: false },
        cause: { type: DataTypes.TEXT, allowNull: true },
        effectiveOn: { type: DataTypes.DATEONLY, allowNull: false },
        recordedBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'animal_status_events', underscored: true, updatedAt: false },
    );
  }
}
