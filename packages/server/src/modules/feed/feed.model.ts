import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { FeedAllocationRule, FeedTarget } from '@burrowline/shared';

/** Feed bought in whole bags (grams, integer cents). */
export class FeedPurchase extends Model<InferAttributes<FeedPurchase>, InferCreationAttributes<FeedPurchase>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare boughtOn: string;
  declare productName: string;
  declare bagGrams: number;
  declare bags: number;
  declare priceCents: number;
  declare crudeProteinPercent: number | null;
  declare note: CreationOptional<string>;
  declare enteredBy: string;
  /** Stock left, first bought first used: stored by feed-book-figures after every change to the book. */
  declare gramsLeft: CreationOptional<number | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    FeedPurchase.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        boughtOn: { type: DataTypes.DATEONLY, allowNull: false },
        productName: { type: DataTypes.TEXT, allowNull: false },
        bagGrams: { type: DataTypes.INTEGER, allowNull: false },
        bags: { type: DataTypes.INTEGER, allowNull: false },
        // bigint comes back as a string from pg; the prices here fit a JS number exactly.
        priceCents: { type: DataTypes.BIGINT, allowNull: false, get() { return Number(this.getDataValue('priceCents')); } },
        crudeProteinPercent: {
          type: DataTypes.DECIMAL(4, 1),
          allowNull: true,
          get() {
            const v = this.getDataValue('crudeProteinPercent') as unknown;
            return v === null || v === undefined ? null : Number(v);
          },
        },
        note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        enteredBy: { type: DataTypes.UUID, allowNull: false },
        gramsLeft: { type: DataTypes.BIGINT, allowNull: true, get() { const v = this.getDataValue('gramsLeft') as unknown; return v === null || v === undefined ? null : Number(v); } },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'feed_purchases', underscored: true, version: true, paranoid: true },
    );
  }
}

/** Feed given on a day (or over a period ending then) to a group, a pen, a doe and her litter, or the farm. */
export class FeedUse extends Model<InferAttributes<FeedUse>, InferCreationAttributes<FeedUse>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare givenOn: string;
  declare fromOn: string;
  declare grams: number;
  declare feedKey: string;
  declare purchaseId: string | null;
  declare target: FeedTarget;
  declare groupId: string | null;
  declare housingUnitId: string | null;
  declare doeId: string | null;
  declare allocation: FeedAllocationRule | null;
  declare note: CreationOptional<string>;
  declare enteredBy: string;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    FeedUse.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        givenOn: { type: DataTypes.DATEONLY, allowNull: false },
        fromOn: { type: DataTypes.DATEONLY, allowNull: false },
        grams: { type: DataTypes.INTEGER, allowNull: false },
        feedKey: { type: DataTypes.TEXT, allowNull: false },
        purchaseId: { type: DataTypes.UUID, allowNull: true },
        target: { type: DataTypes.TEXT, allowNull: false },
        groupId: { type: DataTypes.UUID, allowNull: true },
        housingUnitId: { type: DataTypes.UUID, allowNull: true },
        doeId: { type: DataTypes.UUID, allowNull: true },
        allocation: { type: DataTypes.TEXT, allowNull: true },
        note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        enteredBy: { type: DataTypes.UUID, allowNull: false },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'feed_uses', underscored: true, version: true, paranoid: true },
    );
  }
}

/** A grow-out group's or a nursing litter's share of feed given to a pen or the whole farm. */
export class FeedUseShare extends Model<InferAttributes<FeedUseShare>, InferCreationAttributes<FeedUseShare>> {
  declare coopId: string;
  declare feedUseId: string;
  declare groupId: string | null;
  declare litterId: string | null;
  declare grams: number;

  static initModel(sequelize: Sequelize) {
    FeedUseShare.init(
      {
        coopId: { type: DataTypes.UUID, allowNull: false },
        feedUseId: { type: DataTypes.UUID, allowNull: false, primaryKey: true },
        groupId: { type: DataTypes.UUID, allowNull: true },
        litterId: { type: DataTypes.UUID, allowNull: true },
        grams: { type: DataTypes.INTEGER, allowNull: false },
      },
      { sequelize, tableName: 'feed_use_shares', underscored: true, timestamps: false },
    );
  }
}
