import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/**
 * A palpation of a serviced doe: kits felt (positive), not (negative), or not sure. An apprentice's waits
 * for her mentor (pending); only an accepted one counts.
 */
export class Palpation extends Model<InferAttributes<Palpation>, InferCreationAttributes<Palpation>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare serviceId: string;
  declare palpatedOn: string;
  declare result: 'positive' | 'negative' | 'unsure';
  declare notes: CreationOptional<string>;
  declare recordedBy: string | null;
  declare reviewState: CreationOptional<'pending' | 'accepted' | 'returned'>;
  declare reviewedBy: CreationOptional<string | null>;
  declare reviewedAt: CreationOptional<Date | null>;
  declare reviewComment: CreationOptional<string | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Palpation.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        serviceId: { type: DataTypes.UUID, allowNull: false },
        palpatedOn: { type: DataTypes.DATEONLY, allowNull: false },
        result: { type: DataTypes.TEXT, allowNull: false },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        recordedBy: { type: DataTypes.UUID, allowNull: true },
        reviewState: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'accepted' },
        reviewedBy: { type: DataTypes.UUID, allowNull: true },
        reviewedAt: { type: DataTypes.DATE, allowNull: true },
        reviewComment: { type: DataTypes.TEXT, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'palpations', underscored: true, updatedAt: false },
    );
  }
}
