import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A barn temperature reading, stored in °C to one decimal. */
export class TemperatureReading extends Model<InferAttributes<TemperatureReading>, InferCreationAttributes<TemperatureReading>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare takenAt: Date;
  /** numeric(4,1): PostgreSQL returns it as a string; read it through Number(). */
  declare celsius: number | string;
  declare place: CreationOptional<string>;
  declare recordedBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    TemperatureReading.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        takenAt: { type: DataTypes.DATE, allowNull: false },
        celsius: { type: DataTypes.DECIMAL(4, 1), allowNull: false },
        place: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        recordedBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'temperature_readings', underscored: true, updatedAt: false, paranoid: true },
    );
  }
}
