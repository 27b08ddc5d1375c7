import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";

/** A warning the planner acknowledged, with their reason, when submitting a revision. */
export class PlanAcknowledgement extends Model<
  InferAttributes<PlanAcknowledgement>,
  InferCreationAttributes<PlanAcknowledgement>
> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare checkId: string;
  declare checkItem: string;
  declare checkMessage: string;
  declare reason: string;
  declare userId: number;
  declare createdAt: CreationOptional<Date>;
}

PlanAcknowledgement.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revisionId: { type: DataTypes.INTEGER, allowNull: false },
    checkId: { type: DataTypes.STRING(80), allowNull: false },
    checkItem: { type: DataTypes.STRING(300), allowNull: false },
    checkMessage: { type: DataTypes.TEXT, allowNull: false },
    reason: { type: DataTypes.TEXT, allowNull: false },
    userId: { type: DataTypes.INTEGER, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "plan_acknowledgements", underscored: true, updatedAt: false },
);

export type AcknowledgementInput = Pick<
  InferCreationAttributes<PlanAcknowledgement>,
  "checkId" | "checkItem" | "checkMessage" | "reason" | "userId"
>;

/** The revision's acknowledgements, in the order they were made. */
export async function listAcknowledgements(revisionId: number, transaction?: Transaction) {
  return PlanAcknowledgement.findAll({ where: { revisionId }, order: [["id", "ASC"]], transaction });
}

/** Replaces the revision's acknowledgements with `rows` (a new submission acknowledges afresh). */
export async function replaceAcknowledgements(
  revisionId: number,
  rows: readonly AcknowledgementInput[],
  transaction: Transaction,
) {
  await PlanAcknowledgement.destroy({ where: { revisionId }, transaction });
  for (const row of rows) await PlanAcknowledgement.create({ revisionId, ...row }, { transaction });
}
