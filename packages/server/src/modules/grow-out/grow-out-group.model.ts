import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export type GrowOutStatus = 'growing' | 'closed';

export interface HeadsSold {
  soldOn: string;
  headCount: number;
  /** What sold them (a Swap Board offer). */
  sourceId: string;
}

/** Kits of one or more litters raised together after weaning toward a target live weight. */
export class GrowOutGroup extends Model<InferAttributes<GrowOutGroup>, InferCreationAttributes<GrowOutGroup>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare name: string;
  declare formedOn: string;
  declare targetGrams: number;
  declare housingUnitId: string | null;
  declare status: CreationOptional<GrowOutStatus>;
  declare closedOn: string | null;
  declare notes: CreationOptional<string>;
  /** Heads sold alive (the Swap Board), by day: they leave the group like processed heads. */
  declare headsSold: CreationOptional<HeadsSold[]>;
  declare createdBy: string | null;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    GrowOutGroup.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        name: { type: DataTypes.TEXT, allowNull: false },
        formedOn: { type: DataTypes.DATEONLY, allowNull: false },
        targetGrams: { type: DataTypes.INTEGER, allowNull: false },
        housingUnitId: { type: DataTypes.UUID, allowNull: true },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'growing' },
        closedOn: { type: DataTypes.DATEONLY, allowNull: true },
        notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        headsSold: { type: DataTypes.JSONB, allowNull: false, defaultValue: [] },
        createdBy: { type: DataTypes.UUID, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'grow_out_groups', underscored: true, version: true, paranoid: true },
    );
  }
}

/** Which litters a group's kits came from, and how many heads of each. */
export class GrowOutGroupLitter extends Model<InferAttributes<GrowOutGroupLitter>, InferCreationAttributes<GrowOutGroupLitter>> {
  declare coopId: string;
  declare groupId: string;
  declare litterId: string;
  declare heads: number;

  static initModel(sequelize: Sequelize) {
    GrowOutGroupLitter.init(
      {
        coopId: { type: DataTypes.UUID, allowNull: false },
        groupId: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
        litterId: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
        heads: { type: DataTypes.INTEGER, allowNull: false },
      },
      { sequelize, tableName: 'grow_out_group_litters', underscored: true, timestamps: false },
    );
  }
}
