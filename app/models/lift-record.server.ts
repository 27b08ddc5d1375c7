import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";

/** The rigger's record of the lift made to an approved revision (which it completes). */
export class LiftRecord extends Model<InferAttributes<LiftRecord>, InferCreationAttributes<LiftRecord>> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare checklist: string;
  declare liftedAt: Date;
  declare notes: string;
  declare nearMiss: boolean;
  declare nearMissDetails: string;
  declare recordedBy: number;
  /** The record as a document (JSON, plans/lift-record.ts); null on records made before it was kept. */
  declare document: string | null;
  declare createdAt: CreationOptional<Date>;
}

LiftRecord.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revisionId: { type: DataTypes.INTEGER, allowNull: false, unique: true },
    checklist: { type: DataTypes.TEXT, allowNull: false },
    liftedAt: { type: DataTypes.DATE, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false },
    nearMiss: { type: DataTypes.BOOLEAN, allowNull: false },
    nearMissDetails: { type: DataTypes.TEXT, allowNull: false },
    recordedBy: { type: DataTypes.INTEGER, allowNull: false },
    document: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "lift_records", underscored: true, updatedAt: false },
);

export async function createLiftRecord(
  values: Omit<InferCreationAttributes<LiftRecord>, "id" | "createdAt">,
  transaction: Transaction,
) {
  return LiftRecord.create(values, { transaction });
}

export async function getLiftRecord(revisionId: number) {
  return LiftRecord.findOne({ where: { revisionId } });
}
