import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { CustodyEventKind } from '@burrowline/shared';

/** One move of an animal between farms (or into or out of the co-op). */
export class CustodyEvent extends Model<InferAttributes<CustodyEvent>, InferCreationAttributes<CustodyEvent>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare animalId: string;
  declare kind: CustodyEventKind;
  declare fromFarmId: string | null;
  declare toFarmId: string | null;
  declare owningFarmId: string | null;
  declare keepingFarmId: string | null;
  declare movedOn: string;
  declare tattooBefore: CreationOptional<string | null>;
  declare tattooAfter: CreationOptional<string | null>;
  declare note: CreationOptional<string>;
  /** False when the former owner's private notes stay with it (a Swap Board sale). */
  declare notesTravel: CreationOptional<boolean>;
  declare recordedBy: string | null;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    CustodyEvent.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        animalId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.TEXT, allowNull: false },
        fromFarmId: { type: DataTypes.UUID, allowNull: true },
        toFarmId: { type: DataTypes.UUID, allowNull: true },
        owningFarmId: { type: DataTypes.UUID, allowNull: true },
        keepingFarmId: { type: DataTypes.UUID, allowNull: true },
        movedOn: { type: DataTypes.DATEONLY, allowNull: false },
        tattooBefore: { type: DataTypes.TEXT, allowNull: true },
        tattooAfter: { type: DataTypes.TEXT, allowNull: true },
        note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        notesTravel: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        recordedBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'animal_custody_events', underscored: true, updatedAt: false },
    );
  }
}
