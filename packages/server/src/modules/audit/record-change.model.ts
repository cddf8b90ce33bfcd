import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** One edit of a record others refer to: field → [old, new]. */
export class RecordChange extends Model<InferAttributes<RecordChange>, InferCreationAttributes<RecordChange>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare tableName: string;
  declare recordId: string;
  declare actorUserId: string | null;
  declare changes: Record<string, [unknown, unknown]>;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    RecordChange.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        tableName: { type: DataTypes.TEXT, allowNull: false },
        recordId: { type: DataTypes.UUID, allowNull: false },
        actorUserId: { type: DataTypes.UUID, allowNull: true },
        changes: { type: DataTypes.JSONB, allowNull: false },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'record_changes', underscored: true, updatedAt: false },
    );
  }
}
