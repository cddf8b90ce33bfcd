import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { HerdImportResultDto, HerdImportRowDto, HerdImportStatus, HerdImportSummaryDto } from '@burrowline/shared';

/** A spreadsheet staged for import into a farm's herd: the file as uploaded, its checked rows, and the outcome. */
export class HerdImport extends Model<InferAttributes<HerdImport>, InferCreationAttributes<HerdImport>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string;
  declare uploadedBy: string;
  declare fileName: string;
  declare byteSize: number;
  declare checksum: string;
  declare hadBom: boolean;
  declare content: Buffer;
  declare status: CreationOptional<HerdImportStatus>;
  declare summary: HerdImportSummaryDto;
  declare rows: HerdImportRowDto[];
  declare idempotencyKey: CreationOptional<string | null>;
  declare result: CreationOptional<Omit<HerdImportResultDto, 'confirmedBy' | 'confirmedAt'> | null>;
  declare confirmedBy: CreationOptional<string | null>;
  declare confirmedAt: CreationOptional<Date | null>;
  declare version: CreationOptional<number>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    HerdImport.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: false },
        uploadedBy: { type: DataTypes.UUID, allowNull: false },
        fileName: { type: DataTypes.TEXT, allowNull: false },
        byteSize: { type: DataTypes.INTEGER, allowNull: false },
        checksum: { type: DataTypes.TEXT, allowNull: false },
        hadBom: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
        content: { type: DataTypes.BLOB, allowNull: false },
        status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'ready' },
        summary: { type: DataTypes.JSONB, allowNull: false },
        rows: { type: DataTypes.JSONB, allowNull: false },
        idempotencyKey: { type: DataTypes.UUID, allowNull: true },
        result: { type: DataTypes.JSONB, allowNull: true },
        confirmedBy: { type: DataTypes.UUID, allowNull: true },
        confirmedAt: { type: DataTypes.DATE, allowNull: true },
        version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'herd_imports', underscored: true, version: true },
    );
  }
}
