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
import type { AuthorAct } from "~/plans/authorship";

/** One user's part in writing a revision (created, started, saved, pulled, submitted), first and last time. */
export class PlanRevisionAuthor extends Model<
  InferAttributes<PlanRevisionAuthor>,
  InferCreationAttributes<PlanRevisionAuthor>
> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare userId: number;
  declare act: AuthorAct;
  declare firstAt: Date;
  declare lastAt: Date;
}

PlanRevisionAuthor.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revisionId: { type: DataTypes.INTEGER, allowNull: false },
    userId: { type: DataTypes.INTEGER, allowNull: false },
    act: { type: DataTypes.STRING(20), allowNull: false },
    firstAt: { type: DataTypes.DATE, allowNull: false },
    lastAt: { type: DataTypes.DATE, allowNull: false },
  },
  { sequelize, tableName: "plan_revision_authors", underscored: true, timestamps: false },
);

/** Records that `userId` wrote the revision by `act` now (one row per user and act; the last time moves on). */
export async function recordRevisionAuthor(
  revisionId: number,
  userId: number,
  act: AuthorAct,
  transaction: Transaction,
) {
  const now = new Date();
  const [count] = await PlanRevisionAuthor.update({ lastAt: now }, { where: { revisionId, userId, act }, transaction });
  if (count === 0)
    await PlanRevisionAuthor.create({ revisionId, userId, act, firstAt: now, lastAt: now }, { transaction });
}

/** Everyone who wrote the revisions, oldest first. */
export async function listRevisionAuthors(revisionIds: readonly number[], transaction?: Transaction) {
  if (revisionIds.length === 0) return [];
  return PlanRevisionAuthor.findAll({
    where: { revisionId: { [Op.in]: [...revisionIds] } },
    order: [
      ["firstAt", "ASC"],
      ["id", "ASC"],
    ],
    transaction,
    raw: true,
  });
}
