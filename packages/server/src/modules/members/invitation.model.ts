import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export type InvitationStatus = 'pending' | 'accepted' | 'revoked';

/** A direct invitation by the admin; the farm is joined or created when the person sets a password. */
export class Invitation extends Model<InferAttributes<Invitation>, InferCreationAttributes<Invitation>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare userId: string;
  declare invitedByUserId: string;
  declare status: CreationOptional<InvitationStatus>;
  declare farmId: CreationOptional<string | null>;
  declare newFarmName: CreationOptional<string | null>;
  declare newFarmLocation: CreationOptional<string | null>;
  declare newFarmTimeZone: CreationOptional<string | null>;
  declare newFarmBreeds: CreationOptional<string[] | null>;
  declare acceptedAt: CreationOptional<Date | null>;
  declare revokedAt: CreationOptional<Date | null>;
  declare revokedByUserId: CreationOptional<string | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Invitation.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        userId: { type: DataTypes.UUID, allowNull: false },
        invitedByUserId: { type: DataTypes.UUID, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'pending' },
        farmId: { type: DataTypes.UUID, allowNull: true },
        newFarmName: { type: DataTypes.TEXT, allowNull: true },
        newFarmLocation: { type: DataTypes.TEXT, allowNull: true },
        newFarmTimeZone: { type: DataTypes.TEXT, allowNull: true },
        newFarmBreeds: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: true },
        acceptedAt: { type: DataTypes.DATE, allowNull: true },
        revokedAt: { type: DataTypes.DATE, allowNull: true },
        revokedByUserId: { type: DataTypes.UUID, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'invitations', underscored: true, version: true },
    );
  }
}
