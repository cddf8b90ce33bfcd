import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<string>;
  declare coopId: string | null;
  declare actorUserId: string | null;
  declare action: string;
  declare subjectType: CreationOptional<string | null>;
  declare subjectId: CreationOptional<string | null>;
  declare details: CreationOptional<Record<string, unknown>>;
  declare ip: CreationOptional<string | null>;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    AuditEvent.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: true },
        actorUserId: { type: DataTypes.UUID, allowNull: true },
        action: { type: DataTypes.TEXT, allowNull: false },
        subjectType: { type: DataTypes.TEXT, allowNull: true },
        subjectId: { type: DataTypes.UUID, allowNull: true },
        details: { type: DataTypes.JSONB, allowNull: false, defaultValue: {} },
        ip: { type: DataTypes.TEXT, allowNull: true },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'audit_events', underscored: true, updatedAt: false },
    );
  }
}
