import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { BodyType, SizeClass, SourcedValue } from '@burrowline/shared';

/** A breed of the catalogue (no co-op) or one a co-op's admin added. */
export class Breed extends Model<InferAttributes<Breed>, InferCreationAttributes<Breed>> {
  declare id: CreationOptional<string>;
  declare coopId: string | null;
  declare name: string;
  declare seniorBuckMinGrams: number | null;
  declare seniorBuckMaxGrams: number | null;
  declare seniorDoeMinGrams: number | null;
  declare seniorDoeMaxGrams: number | null;
  declare idealWeightGrams: number | null;
  declare showClassCount: 4 | 6;
  declare bodyType: BodyType | null;
  declare sizeClass: SizeClass;
  declare doeFirstBreedingMinDays: number;
  declare doeFirstBreedingMaxDays: number;
  declare buckFirstBreedingMinDays: number;
  declare buckFirstBreedingMaxDays: number;
  declare slowGrowing: CreationOptional<boolean>;
  declare heavyBoned: CreationOptional<boolean>;
  declare meatNotes: CreationOptional<string>;
  declare sources: CreationOptional<Record<string, SourcedValue | null>>;
  declare createdBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    Breed.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: true },
        name: { type: DataTypes.TEXT, allowNull: false },
        seniorBuckMinGrams: { type: DataTypes.INTEGER, allowNull: true },
        seniorBuckMaxGrams: { type: DataTypes.INTEGER, allowNull: true },
        seniorDoeMinGrams: { type: DataTypes.INTEGER, allowNull: true },
        seniorDoeMaxGrams: { type: DataTypes.INTEGER, allowNull: true },
        idealWeightGrams: { type: DataTypes.INTEGER, allowNull: true },
        showClassCount: { type: DataTypes.INTEGER, allowNull: false },
        bodyType: { type: DataTypes.TEXT, allowNull: true },
        sizeClass: { type: DataTypes.TEXT, allowNull: false },
        doeFirstBreedingMinDays: { type: DataTypes.INTEGER, allowNull: false },
        doeFirstBreedingMaxDays: { type: DataTypes.INTEGER, allowNull: false },
        buckFirstBreedingMinDays: { type: DataTypes.INTEGER, allowNull: false },
        buckFirstBreedingMaxDays: { type: DataTypes.INTEGER, allowNull: false },
        slowGrowing: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        heavyBoned: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        meatNotes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        sources: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'breeds', underscored: true, paranoid: true },
    );
  }
}
