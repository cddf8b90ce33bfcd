import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { KitDeathCause, LitterEventKind, ReviewState } from '@burrowline/shared';
import { reviewColumns } from '../../db/review-columns';

/** A dated change of a litter's kit count; a fostering is two of these sharing a pair id. */
export class LitterEvent extends Model<InferAttributes<LitterEvent>, InferCreationAttributes<LitterEvent>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare litterId: string;
  declare kind: LitterEventKind;
  declare occurredOn: string;
  declare kitCount: number;
  declare cause: string | null;
  /** Lost kits: why they died, from the shared list. */
  declare deathCause: CreationOptional<KitDeathCause | null>;
  declare otherLitterId: string | null;
  declare pairId: string | null;
  /** Total live weight of the kits weaned (a 'weaned' event only), when weighed. */
  declare weaningWeightGrams: CreationOptional<number | null>;
  declare enteredBy: string | null;
  declare reviewState: CreationOptional<ReviewState>;
  declare reviewedBy: CreationOptional<string | null>;
  declare reviewedAt: CreationOptional<Date | null>;
  declare reviewComment: CreationOptional<string | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    LitterEvent.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        litterId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.TEXT, allowNull: false },
        occurredOn: { type: DataTypes.DATEONLY, allowNull: false },
        kitCount: { type: DataTypes.INTEGER, allowNull: false },
        cause: { type: DataTypes.TEXT, allowNull: true },
        deathCause: { type: DataTypes.TEXT, allowNull: true },
        otherLitterId: { type: DataTypes.UUID, allowNull: true },
        pairId: { type: DataTypes.UUID, allowNull: true },
        weaningWeightGrams: { type: DataTypes.INTEGER, allowNull: true },
        enteredBy: { type: DataTypes.UUID, allowNull: true },
        ...reviewColumns({ defaultState: 'accepted' }),
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'litter_events', underscored: true, version: true, paranoid: true },
    );
  }
}
