import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { PlannedTaskKind, ReviewState, TaskAnchor, TaskState } from '@burrowline/shared';

/** One dated job of a farm's Almanac; its id is the calendar feed's UID. */
export class AlmanacTask extends Model<InferAttributes<AlmanacTask>, InferCreationAttributes<AlmanacTask>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare kind: PlannedTaskKind;
  declare key: string;
  declare anchor: TaskAnchor;
  declare anchorDate: string;
  declare sourceId: string;
  declare serviceId: string | null;
  declare litterId: string | null;
  declare animalId: string | null;
  declare dueOn: string;
  declare windowStart: string | null;
  declare windowEnd: string | null;
  declare ageDays: number | null;
  declare state: CreationOptional<TaskState>;
  declare stateReason: CreationOptional<string | null>;
  declare movedFrom: CreationOptional<string | null>;
  declare doneOn: CreationOptional<string | null>;
  declare doneBy: CreationOptional<string | null>;
  declare note: CreationOptional<string>;
  declare completionReview: CreationOptional<ReviewState>;
  declare reviewedBy: CreationOptional<string | null>;
  declare reviewedAt: CreationOptional<Date | null>;
  declare reviewComment: CreationOptional<string | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    AlmanacTask.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        kind: { type: DataTypes.TEXT, allowNull: false },
        key: { type: DataTypes.TEXT, allowNull: false },
        anchor: { type: DataTypes.TEXT, allowNull: false },
        anchorDate: { type: DataTypes.DATEONLY, allowNull: false },
        sourceId: { type: DataTypes.UUID, allowNull: false },
        serviceId: { type: DataTypes.UUID, allowNull: true },
        litterId: { type: DataTypes.UUID, allowNull: true },
        animalId: { type: DataTypes.UUID, allowNull: true },
        dueOn: { type: DataTypes.DATEONLY, allowNull: false },
        windowStart: { type: DataTypes.DATEONLY, allowNull: true },
        windowEnd: { type: DataTypes.DATEONLY, allowNull: true },
        ageDays: { type: DataTypes.INTEGER, allowNull: true },
        state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'open' },
        stateReason: { type: DataTypes.TEXT, allowNull: true },
        movedFrom: { type: DataTypes.DATEONLY, allowNull: true },
        doneOn: { type: DataTypes.DATEONLY, allowNull: true },
        doneBy: { type: DataTypes.UUID, allowNull: true },
        note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        completionReview: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'accepted' },
        reviewedBy: { type: DataTypes.UUID, allowNull: true },
        reviewedAt: { type: DataTypes.DATE, allowNull: true },
        reviewComment: { type: DataTypes.TEXT, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'almanac_tasks', underscored: true, version: true },
    );
  }
}
