import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** An animal or a litter in a housing unit from one date, until it ends. */
export class HousingPlacement extends Model<InferAttributes<HousingPlacement>, InferCreationAttributes<HousingPlacement>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare unitId: string;
  declare animalId: string | null;
  declare litterId: string | null;
  declare placedOn: string;
  declare endedOn: CreationOptional<string | null>;
  declare note: CreationOptional<string>;
  declare recordedBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    HousingPlacement.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        unitId: { type: DataTypes.UUID, allowNull: false },
        animalId: { type: DataTypes.UUID, allowNull: true },
        litterId: { type: DataTypes.UUID, allowNull: true },
        placedOn: { type: DataTypes.DATEONLY, allowNull: false },
        endedOn: { type: DataTypes.DATEONLY, allowNull: true },
        note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        recordedBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'housing_placements', underscored: true },
    );
  }
}
