import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export type TokenPurpose = 'set_password' | 'reset_password';

/** Single-use links (set password, reset password); only the SHA-256 of the token is stored. */
export class OneTimeToken extends Model<InferAttributes<OneTimeToken>, InferCreationAttributes<OneTimeToken>> {
  declare id: CreationOptional<string>;
  declare userId: string;
  declare coopId: string;
  declare purpose: TokenPurpose;
  declare tokenHash: string;
  declare expiresAt: Date;
  declare usedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    OneTimeToken.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        userId: { type: DataTypes.UUID, allowNull: false },
        coopId: { type: DataTypes.UUID, allowNull: false },
        purpose: { type: DataTypes.TEXT, allowNull: false },
        tokenHash: { type: DataTypes.TEXT, allowNull: false },
        expiresAt: { type: DataTypes.DATE, allowNull: false },
        usedAt: { type: DataTypes.DATE, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'one_time_tokens', underscored: true, updatedAt: false },
    );
  }
}
