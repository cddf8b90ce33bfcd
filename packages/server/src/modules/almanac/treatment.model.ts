import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A veterinarian's (extralabel) treatment of an animal, to the end of the withdrawal time set. */
export class Treatment extends Model<InferAttributes<Treatment>, InferCreationAttributes<Treatment>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare animalId: string;
  declare startedOn: string;
  declare endsOn: string;
  declare treatment: string;
  declare veterinarian: CreationOptional<string>;
  declare notes: CreationOptional<string>;
  declare recordedBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    Treatment.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        animalId: { type: DataTypes.UUID, allowNull: false },
        startedOn: { type: DataTypes.DATEONLY, allowNull: false },
        endsOn: { type: DataTypes.DATEONLY, allowNull: false },
        treatment: { type: DataTypes.TEXT, allowNull: false },
        veterinarian: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        recordedBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'treatments', underscored: true, updatedAt: false, paranoid: true },
    );
  }
}
