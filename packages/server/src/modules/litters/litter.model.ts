import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A litter: kindled from a service (sire and dam fixed), with born alive and born dead. */
export class Litter extends Model<InferAttributes<Litter>, InferCreationAttributes<Litter>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare serviceId: string;
  declare damId: string;
  declare sireId: string;
  declare kindledOn: string;
  declare bornAlive: number;
  declare bornDead: number;
  declare notes: CreationOptional<string>;
  declare recordedBy: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    Litter.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        serviceId: { type: DataTypes.UUID, allowNull: false },
        damId: { type: DataTypes.UUID, allowNull: false },
        sireId: { type: DataTypes.UUID, allowNull: false },
        kindledOn: { type: DataTypes.DATEONLY, allowNull: false },
        bornAlive: { type: DataTypes.INTEGER, allowNull: false },
        bornDead: { type: DataTypes.INTEGER, allowNull: false },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        recordedBy: { type: DataTypes.UUID, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'litters', underscored: true, version: true, paranoid: true },
    );
  }
}
