import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";

/** What a stored file is for; a staged import is a CSV kept between its preview and its confirmation. */
export type FilePurpose = "certificate" | "gear-import" | "drawing" | "photo";

/** The record of one uploaded file; its bytes live under UPLOAD_DIR at `storageKey`. */
export class StoredFile extends Model<InferAttributes<StoredFile>, InferCreationAttributes<StoredFile>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare storageKey: string;
  declare purpose: string;
  declare originalName: string;
  declare contentType: string;
  declare sizeBytes: number;
  declare uploadedBy: number | null;
  declare createdAt: CreationOptional<Date>;
}

StoredFile.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: { type: DataTypes.INTEGER, allowNull: false },
    storageKey: { type: DataTypes.STRING(80), allowNull: false, unique: true },
    purpose: { type: DataTypes.STRING(30), allowNull: false },
    originalName: { type: DataTypes.STRING(255), allowNull: false },
    contentType: { type: DataTypes.STRING(100), allowNull: false },
    sizeBytes: { type: DataTypes.INTEGER, allowNull: false },
    uploadedBy: { type: DataTypes.INTEGER, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "stored_files", underscored: true, updatedAt: false },
);

export async function createStoredFileRecord(
  input: Omit<InferCreationAttributes<StoredFile>, "id" | "createdAt">,
  transaction?: Transaction,
) {
  return StoredFile.create(input, { transaction });
}

/** The organisation's file with this id (optionally only of one purpose), or null. */
export async function getStoredFile(organisationId: number, fileId: number, purpose?: FilePurpose) {
  return StoredFile.findOne({ where: { organisationId, id: fileId, ...(purpose ? { purpose } : {}) } });
}
