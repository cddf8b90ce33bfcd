import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Disposition, Lifecycle, Sex } from '@burrowline/shared';

/** One animal for life, on whatever farm; outside animals (from papers) are rows with `isOutside`. */
export class Animal extends Model<InferAttributes<Animal>, InferCreationAttributes<Animal>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare isOutside: CreationOptional<boolean>;
  declare breedingFarmId: string | null;
  declare breederName: CreationOptional<string>;
  declare owningFarmId: string | null;
  declare keepingFarmId: string | null;
  declare tattoo: string | null;
  declare name: CreationOptional<string>;
  declare sex: Sex;
  declare breedId: string | null;
  declare colour: CreationOptional<string>;
  declare birthDate: string | null;
  declare sireId: string | null;
  declare damId: string | null;
  declare registrationNumber: string | null;
  declare notes: CreationOptional<string>;
  declare hutch: CreationOptional<string>;
  declare lifecycle: CreationOptional<Lifecycle>;
  declare disposition: CreationOptional<Disposition>;
  declare dispositionCause: CreationOptional<string | null>;
  declare mergedIntoId: CreationOptional<string | null>;
  declare createdBy: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    Animal.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        isOutside: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        breedingFarmId: { type: DataTypes.UUID, allowNull: true },
        breederName: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        owningFarmId: { type: DataTypes.UUID, allowNull: true },
        keepingFarmId: { type: DataTypes.UUID, allowNull: true },
        tattoo: { type: DataTypes.TEXT, allowNull: true },
        name: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        sex: { type: DataTypes.TEXT, allowNull: false },
        breedId: { type: DataTypes.UUID, allowNull: true },
        colour: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        birthDate: { type: DataTypes.DATEONLY, allowNull: true },
        sireId: { type: DataTypes.UUID, allowNull: true },
        damId: { type: DataTypes.UUID, allowNull: true },
        registrationNumber: { type: DataTypes.TEXT, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        hutch: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        lifecycle: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'kit' },
        disposition: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'on_farm' },
        dispositionCause: { type: DataTypes.TEXT, allowNull: true },
        mergedIntoId: { type: DataTypes.UUID, allowNull: true },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'animals', underscored: true, version: true, paranoid: true },
    );
  }
}
