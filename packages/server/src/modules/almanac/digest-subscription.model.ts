import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A person's opt-in to the morning e-mail, at an hour of their farm's clock. */
export class DigestSubscription extends Model<InferAttributes<DigestSubscription>, InferCreationAttributes<DigestSubscription>> {
  declare userId: string;
  declare coopId: string;
  declare enabled: boolean;
  declare hour: number;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    DigestSubscription.init(
      {
        userId: { type: DataTypes.UUID, primaryKey: true },
        coopId: { type: DataTypes.UUID, allowNull: false },
        enabled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
        hour: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 6 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'almanac_digest_subscriptions', underscored: true },
    );
  }
}
