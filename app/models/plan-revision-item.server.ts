import {
  DataTypes,
  Model,
  Op,
  QueryTypes,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";

/** A gear item an approved revision's sealed record allocates (an index of the record, written with it). */
export class PlanRevisionItem extends Model<
  InferAttributes<PlanRevisionItem>,
  InferCreationAttributes<PlanRevisionItem>
> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare gearItemId: number;
}

PlanRevisionItem.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revisionId: { type: DataTypes.INTEGER, allowNull: false },
    gearItemId: { type: DataTypes.INTEGER, allowNull: false },
  },
  { sequelize, tableName: "plan_revision_items", underscored: true, timestamps: false },
);

export async function addRevisionItems(revisionId: number, gearItemIds: readonly number[], transaction: Transaction) {
  const ids = [...new Set(gearItemIds)];
  if (ids.length)
    await PlanRevisionItem.bulkCreate(
      ids.map((gearItemId) => ({ revisionId, gearItemId })),
      { transaction },
    );
}

/** The ids of the revisions whose sealed record allocates any of the items. */
export async function listRevisionIdsUsingItems(gearItemIds: readonly number[]) {
  if (gearItemIds.length === 0) return [];
  const rows = await PlanRevisionItem.findAll({
    where: { gearItemId: { [Op.in]: [...new Set(gearItemIds)] } },
    attributes: ["revisionId"],
    raw: true,
  });
  return [...new Set(rows.map((r) => r.revisionId))];
}

/** The ids of the organisation's items that its approved revisions allocate. */
export async function listItemIdsInApprovedRevisions(organisationId: number) {
  const rows = await sequelize.query<{ gearItemId: number }>(
    `SELECT DISTINCT i.gear_item_id AS "gearItemId"
     FROM plan_revision_items i
     JOIN plan_revisions r ON r.id = i.revision_id AND r.status = 'approved'
     JOIN plans p ON p.id = r.plan_id AND p.organisation_id = $organisationId`,
    { bind: { organisationId }, type: QueryTypes.SELECT },
  );
  return rows.map((r) => r.gearItemId);
}
