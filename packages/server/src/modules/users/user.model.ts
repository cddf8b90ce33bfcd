import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { Role } from '@burrowline/shared';

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string | null;
  declare mentorId: CreationOptional<string | null>;
  declare email: string;
  declare name: string;
  declare role: Role;
  declare passwordHash: CreationOptional<string | null>;
  declare disabledAt: CreationOptional<Date | null>;
  declare disabledReason: CreationOptional<string | null>;
  declare sessionsValidAfter: CreationOptional<Date>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    User.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: true },
        mentorId: { type: DataTypes.UUID, allowNull: true },
        email: { type: DataTypes.TEXT, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        role: { type: DataTypes.TEXT, allowNull: false },
        passwordHash: { type: DataTypes.TEXT, allowNull: true },
        disabledAt: { type: DataTypes.DATE, allowNull: true },
        disabledReason: { type: DataTypes.TEXT, allowNull: true },
        sessionsValidAfter: { type: DataTypes.DATE, allowNull: false, defaultValue: new Date(0) },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'users', underscored: true, version: true },
    );
  }
}
