import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ReviewState } from '@burrowline/shared';
import { reviewColumns } from '../../db/review-columns';

/** The weight of one animal or of a group (total over head count); farm-private. */
export class WeighIn extends Model<InferAttributes<WeighIn>, InferCreationAttributes<WeighIn>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare animalId: string | null;
  declare groupId: CreationOptional<string | null>;
  declare groupLabel: string | null;
  /** A litter weighed kit by kit in a weighing round. */
  declare litterId: CreationOptional<string | null>;
  /** The weighing round that saved it, if any. */
  declare roundId: CreationOptional<string | null>;
  declare totalGrams: number;
  declare headCount: number;
  declare weighedOn: string;
  /** A group weighed kit by kit: each kit's weight, with its label when given. */
  declare kitWeights: CreationOptional<{ label: string | null; grams: number }[] | null>;
  declare note: CreationOptional<string>;
  declare enteredBy: string;
  declare reviewState: ReviewState;
  declare reviewedBy: CreationOptional<string | null>;
  declare reviewedAt: CreationOptional<Date | null>;
  declare reviewComment: CreationOptional<string | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    WeighIn.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        animalId: { type: DataTypes.UUID, allowNull: true },
        groupId: { type: DataTypes.UUID, allowNull: true },
        groupLabel: { type: DataTypes.TEXT, allowNull: true },
        litterId: { type: DataTypes.UUID, allowNull: true },
        roundId: { type: DataTypes.UUID, allowNull: true },
        totalGrams: { type: DataTypes.INTEGER, allowNull: false },
        headCount: { type: DataTypes.INTEGER, allowNull: false },
        weighedOn: { type: DataTypes.DATEONLY, allowNull: false },
        kitWeights: { type: DataTypes.JSONB, allowNull: true },
        note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        enteredBy: { type: DataTypes.UUID, allowNull: false },
        ...reviewColumns(),
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'weigh_ins', underscored: true, version: true, paranoid: true },
    );
  }
}
