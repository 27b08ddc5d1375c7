import {
  DataTypes,
  Model,
  Op,
  UniqueConstraintError,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from "sequelize";
import { sequelize } from "~/utils/db.server";

/** The kept sealed body of a printed plan (a PDF without the live band and printed line), by its key. */
export class SealedPrintBody extends Model<InferAttributes<SealedPrintBody>, InferCreationAttributes<SealedPrintBody>> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare bodyKey: string;
  /** Which build of the PDF code made it. */
  declare builder: string;
  declare body: Buffer;
  declare createdAt: CreationOptional<Date>;
}

SealedPrintBody.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revisionId: { type: DataTypes.INTEGER, allowNull: false },
    bodyKey: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    builder: { type: DataTypes.STRING(64), allowNull: false },
    body: { type: DataTypes.BLOB, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "sealed_print_bodies", underscored: true, updatedAt: false },
);

/** The kept body under `bodyKey`, or null. */
export async function getSealedPrintBody(bodyKey: string): Promise<Uint8Array | null> {
  const row = await SealedPrintBody.findOne({ where: { bodyKey }, attributes: ["body"] });
  return row ? new Uint8Array(row.body) : null;
}

/**
 * Keeps a body, dropping the revision's bodies made by other builds (never asked for again); when two first
 * prints race, the one kept first stays (both are the same sealed content).
 */
export async function keepSealedPrintBody(revisionId: number, builder: string, bodyKey: string, body: Uint8Array) {
  await SealedPrintBody.destroy({ where: { revisionId, builder: { [Op.ne]: builder } } });
  try {
    await SealedPrintBody.create({ revisionId, builder, bodyKey, body: Buffer.from(body) });
  } catch (error) {
    if (!(error instanceof UniqueConstraintError)) throw error;
  }
}
