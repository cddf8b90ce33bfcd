import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ReviewState } from '@burrowline/shared';
import { reviewColumns } from '../../db/review-columns';

/** A dated observation about an animal; an apprentice's waits for review. */
export class AnimalNote extends Model<InferAttributes<AnimalNote>, InferCreationAttributes<AnimalNote>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare animalId: string;
  declare body: string;
  declare notedOn: string;
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
    AnimalNote.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        animalId: { type: DataTypes.UUID, allowNull: false },
        body: { type: DataTypes.TEXT, allowNull: false },
        notedOn: { type: DataTypes.DATEONLY, allowNull: false },
        enteredBy: { type: DataTypes.UUID, allowNull: false },
        ...reviewColumns(),
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'animal_notes', underscored: true, version: true, paranoid: true },
    );
  }
}
