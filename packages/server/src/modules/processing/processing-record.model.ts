import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { UsdaClass, YieldFlag } from '@burrowline/shared';

/** One animal, or a batch of a grow-out group's heads, processed on a date, with its yields as computed when saved. */
export class ProcessingRecord extends Model<InferAttributes<ProcessingRecord>, InferCreationAttributes<ProcessingRecord>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare processedOn: string;
  declare animalId: string | null;
  declare groupId: string | null;
  declare headCount: number;
  declare ageDays: number | null;
  declare liveGrams: number;
  declare hotCarcassGrams: number;
  declare chilledCarcassGrams: number | null;
  /** numeric(5,2): strings from PostgreSQL. */
  declare hotDressOutPercent: number | string;
  declare chilledDressOutPercent: number | string | null;
  declare usdaClass: UsdaClass;
  declare usdaClassReason: string;
  declare usdaClassNote: string | null;
  declare flags: YieldFlag[];
  declare notes: CreationOptional<string>;
  declare recordedBy: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    ProcessingRecord.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        processedOn: { type: DataTypes.DATEONLY, allowNull: false },
        animalId: { type: DataTypes.UUID, allowNull: true },
        groupId: { type: DataTypes.UUID, allowNull: true },
        headCount: { type: DataTypes.INTEGER, allowNull: false },
        ageDays: { type: DataTypes.INTEGER, allowNull: true },
        liveGrams: { type: DataTypes.INTEGER, allowNull: false },
        hotCarcassGrams: { type: DataTypes.INTEGER, allowNull: false },
        chilledCarcassGrams: { type: DataTypes.INTEGER, allowNull: true },
        hotDressOutPercent: { type: DataTypes.DECIMAL(5, 2), allowNull: false },
        chilledDressOutPercent: { type: DataTypes.DECIMAL(5, 2), allowNull: true },
        usdaClass: { type: DataTypes.TEXT, allowNull: false },
        usdaClassReason: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        usdaClassNote: { type: DataTypes.TEXT, allowNull: true },
        flags: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        recordedBy: { type: DataTypes.UUID, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'processing_records', underscored: true, version: true, paranoid: true },
    );
  }
}

/** An animal or group set aside for a planned processing date. */
export class ProcessingMark extends Model<InferAttributes<ProcessingMark>, InferCreationAttributes<ProcessingMark>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare animalId: string | null;
  declare groupId: string | null;
  declare plannedOn: string;
  declare status: CreationOptional<'planned' | 'done' | 'cancelled'>;
  declare notes: CreationOptional<string>;
  declare markedBy: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    ProcessingMark.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        animalId: { type: DataTypes.UUID, allowNull: true },
        groupId: { type: DataTypes.UUID, allowNull: true },
        plannedOn: { type: DataTypes.DATEONLY, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'planned' },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        markedBy: { type: DataTypes.UUID, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'processing_marks', underscored: true, version: true, paranoid: true },
    );
  }
}
