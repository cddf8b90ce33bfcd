import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** An admin has opened an application (the queue's "new" marks and the unread badge). */
export class ApplicationView extends Model<InferAttributes<ApplicationView>, InferCreationAttributes<ApplicationView>> {
  declare applicationId: string;
  declare userId: string;
  declare coopId: string;
  declare viewedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    ApplicationView.init(
      {
        applicationId: { type: DataTypes.UUID, primaryKey: true },
        userId: { type: DataTypes.UUID, primaryKey: true },
        coopId: { type: DataTypes.UUID, allowNull: false },
        viewedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
      },
      { sequelize, tableName: 'application_views', underscored: true, timestamps: false },
    );
  }
}
