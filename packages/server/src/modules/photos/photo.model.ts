import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import type { PhotoSubject } from '@burrowline/shared';

/** A photo of an animal, a farm profile, a chore or a chat message; its files are in the storage module under server-made keys. */
export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
  declare id: CreationOptional<string>;
  declare coopId: string;
  declare farmId: string | null;
  declare subject: PhotoSubject;
  declare animalId: string | null;
  declare choreEntryId: CreationOptional<string | null>;
  declare chatThreadId: CreationOptional<string | null>;
  declare chatMessageId: CreationOptional<string | null>;
  declare storageKey: string;
  declare thumbnailKey: string;
  declare contentType: string;
  declare byteSize: number;
  declare thumbnailByteSize: number;
  declare width: number;
  declare height: number;
  declare checksum: string;
  declare caption: CreationOptional<string>;
  declare uploadedBy: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare deletedAt: CreationOptional<Date | null>;

  static initModel(sequelize: Sequelize) {
    Photo.init(
      {
        id: { type: DataTypes.UUID, primaryKey: true, defaultValue: DataTypes.UUIDV4 },
        coopId: { type: DataTypes.UUID, allowNull: false },
        farmId: { type: DataTypes.UUID, allowNull: true },
        choreEntryId: { type: DataTypes.UUID, allowNull: true },
        chatThreadId: { type: DataTypes.UUID, allowNull: true },
        chatMessageId: { type: DataTypes.UUID, allowNull: true },
        subject: { type: DataTypes.TEXT, allowNull: false },
        animalId: { type: DataTypes.UUID, allowNull: true },
        storageKey: { type: DataTypes.TEXT, allowNull: false },
        thumbnailKey: { type: DataTypes.TEXT, allowNull: false },
        contentType: { type: DataTypes.TEXT, allowNull: false },
        byteSize: { type: DataTypes.INTEGER, allowNull: false },
        thumbnailByteSize: { type: DataTypes.INTEGER, allowNull: false },
        width: { type: DataTypes.INTEGER, allowNull: false },
        height: { type: DataTypes.INTEGER, allowNull: false },
        checksum: { type: DataTypes.TEXT, allowNull: false },
        caption: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
        uploadedBy: { type: DataTypes.UUID, allowNull: true },
        createdAt: DataTypes.DATE,
        updatedAt: DataTypes.DATE,
        deletedAt: DataTypes.DATE,
      },
      { sequelize, tableName: 'photos', underscored: true, paranoid: true },
    );
  }
}
