import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { ApplicationStatus, SharingOption } from '@burrowline/shared';

/** An application to join a co-op; never deleted, the decision stays on it. */
export class Application extends Model<InferAttributes<Application>, InferCreationAttributes<Application>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare idempotencyKey: string;
  declare status: CreationOptional<ApplicationStatus>;
  declare applicantName: string;
  declare email: string;
  declare phone: string;
  declare farmName: string;
  declare location: string;
  declare timeZone: string;
  declare breedsKept: string[];
  declare does: number;
  declare bucks: number;
  declare quarantinePractice: string;
  declare diseaseLastYear: boolean;
  declare diseaseDetails: string;
  declare sharing: SharingOption[];
  declare sharingNotes: string;
  declare rulesTextAgreed: string;
  declare rulesAgreedAt: Date;
  declare reviewedByUserId: CreationOptional<string | null>;
  declare reviewedAt: CreationOptional<Date | null>;
  declare decisionNote: CreationOptional<string | null>;
  declare userId: CreationOptional<string | null>;
  declare farmId: CreationOptional<string | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Application.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        idempotencyKey: { type: DataTypes.UUID, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'pending' },
        applicantName: { type: DataTypes.TEXT, allowNull: false },
        email: { type: DataTypes.TEXT, allowNull: false },
        phone: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        farmName: { type: DataTypes.TEXT, allowNull: false },
        location: { type: DataTypes.TEXT, allowNull: false },
        timeZone: { type: DataTypes.TEXT, allowNull: false },
        breedsKept: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
        does: { type: DataTypes.INTEGER, allowNull: false },
        bucks: { type: DataTypes.INTEGER, allowNull: false },
        quarantinePractice: { type: DataTypes.TEXT, allowNull: false },
        diseaseLastYear: { type: DataTypes.BOOLEAN, allowNull: false },
        diseaseDetails: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        sharing: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
        sharingNotes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        rulesTextAgreed: { type: DataTypes.TEXT, allowNull: false },
        rulesAgreedAt: { type: DataTypes.DATE, allowNull: false },
        reviewedByUserId: { type: DataTypes.UUID, allowNull: true },
        reviewedAt: { type: DataTypes.DATE, allowNull: true },
        decisionNote: { type: DataTypes.TEXT, allowNull: true },
        userId: { type: DataTypes.UUID, allowNull: true },
        farmId: { type: DataTypes.UUID, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'applications', underscored: true, version: true },
    );
  }
}
