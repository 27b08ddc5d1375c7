import {
  DataTypes,
  Model,
  Op,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";

/** A comment on a revision: why it was returned, the approver's comment, or why the plan was cancelled. */
export class PlanComment extends Model<InferAttributes<PlanComment>, InferCreationAttributes<PlanComment>> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare userId: number;
  declare kind: "return" | "approval" | "cancel";
  declare body: string;
  declare createdAt: CreationOptional<Date>;
}

PlanComment.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revisionId: { type: DataTypes.INTEGER, allowNull: false },
    userId: { type: DataTypes.INTEGER, allowNull: false },
    kind: { type: DataTypes.STRING(20), allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "plan_comments", underscored: true, updatedAt: false },
);

export async function addPlanComment(
  comment: Pick<InferCreationAttributes<PlanComment>, "revisionId" | "userId" | "kind" | "body">,
  transaction: Transaction,
) {
  await PlanComment.create(comment, { transaction });
}

/** The comments on any of the revisions, newest first. */
export async function listPlanComments(revisionIds: readonly number[]) {
  if (revisionIds.length === 0) return [];
  return PlanComment.findAll({ where: { revisionId: { [Op.in]: [...revisionIds] } }, order: [["id", "DESC"]] });
}
