import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";

/** A photo taken at the lift, kept with its record (the bytes are a stored file). */
export class LiftRecordPhoto extends Model<InferAttributes<LiftRecordPhoto>, InferCreationAttributes<LiftRecordPhoto>> {
  declare id: CreationOptional<number>;
  declare liftRecordId: number;
  declare storedFileId: number;
}

LiftRecordPhoto.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    liftRecordId: { type: DataTypes.INTEGER, allowNull: false },
    storedFileId: { type: DataTypes.INTEGER, allowNull: false },
  },
  { sequelize, tableName: "lift_record_photos", underscored: true, timestamps: false },
);

export async function addLiftRecordPhoto(liftRecordId: number, storedFileId: number, transaction: Transaction) {
  await LiftRecordPhoto.create({ liftRecordId, storedFileId }, { transaction });
}

/** The stored file ids of the record's photos, in the order they were added. */
export async function listLiftRecordPhotoIds(liftRecordId: number) {
  const rows = await LiftRecordPhoto.findAll({ where: { liftRecordId }, order: [["id", "ASC"]] });
  return rows.map((p) => p.storedFileId);
}
