import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A farm's calendar feed secret; only its SHA-256 is stored (outside row-level security, see migration 0018). */
export class CalendarFeedToken extends Model<InferAttributes<CalendarFeedToken>, InferCreationAttributes<CalendarFeedToken>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare createdBy: string;
  declare tokenHash: string;
  declare createdAt: CreationOptional<Date>;
  declare lastUsedAt: CreationOptional<Date | null>;
  declare revokedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    CalendarFeedToken.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        createdBy: { type: DataTypes.UUID, allowNull: false },
        tokenHash: { type: DataTypes.TEXT, allowNull: false },
        createdAt: DataTypes.DATE,
        lastUsedAt: { type: DataTypes.DATE, allowNull: true },
        revokedAt: { type: DataTypes.DATE, allowNull: true },
      },
      { sequelize, tableName: 'calendar_feed_tokens', underscored: true, updatedAt: false },
    );
  }
}
