import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * A veterinarian's (extralabel) treatment of an animal or a grow-out group, to the end of the withdrawal
 * time set. `endsOn` is the last day under withdrawal (rows saved before treatments recorded them have no dose, route or
 * last day of treatment).
 */
export class Treatment extends Model<InferAttributes<Treatment>, InferCreationAttributes<Treatment>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare animalId: string | null;
  declare groupId: string | null;
  declare startedOn: string;
  declare lastDoseOn: string | null;
  declare endsOn: string;
  declare withdrawalDays: number | null;
  declare treatment: string;
  declare dose: CreationOptional<string>;
  declare route: string | null;
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
        animalId: { type: DataTypes.UUID, allowNull: true },
        groupId: { type: DataTypes.UUID, allowNull: true },
        startedOn: { type: DataTypes.DATEONLY, allowNull: false },
        lastDoseOn: { type: DataTypes.DATEONLY, allowNull: true },
        endsOn: { type: DataTypes.DATEONLY, allowNull: false },
        withdrawalDays: { type: DataTypes.INTEGER, allowNull: true },
        treatment: { type: DataTypes.TEXT, allowNull: false },
        dose: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        route: { type: DataTypes.TEXT, allowNull: true },
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
