import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Cooperative extends Model<InferAttributes<Cooperative>, InferCreationAttributes<Cooperative>> {
  declare id: CreationOptional<string>;
  declare name: string;
  declare slug: string;
  declare currency: CreationOptional<string>;
  declare quarantineDays: CreationOptional<number>;
  declare rulesText: CreationOptional<string>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Cooperative.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        name: { type: DataTypes.TEXT, allowNull: false },
        slug: { type: DataTypes.TEXT, allowNull: false },
        currency: { type: DataTypes.CHAR(3), allowNull: false, defaultValue: 'USD' },
        quarantineDays: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 30 },
        rulesText: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'cooperatives', underscored: true, version: true },
    );
  }
}
