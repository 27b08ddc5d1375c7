import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Transaction,
} from "sequelize";
import { defaultNextDue } from "~/gear/due";
import { sequelize } from "~/utils/db.server";
import type { ExaminationFields } from "~/gear/schema";
import { recordAudit } from "~/models/audit-event.server";
import { GearItem, setGearStatus } from "~/models/gear-item.server";
import { StoredFile } from "~/models/stored-file.server";
import { User } from "~/models/user.server";
import { transactionWithFiles, type CheckedUpload } from "~/utils/uploads.server";

/** A thorough examination of one item by a competent person (LOLER 1998 reg 9), as its report records it. */
export class Examination extends Model<InferAttributes<Examination>, InferCreationAttributes<Examination>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare gearItemId: number;
  declare examinedOn: string;
  declare examiner: string;
  declare result: "pass" | "fail";
  declare defects: CreationOptional<string>;
  declare nextDueOn: string;
  declare certificateFileId: number | null;
  declare recordedBy: number;
  declare createdAt: CreationOptional<Date>;
  declare certificate?: NonAttribute<StoredFile | null>;
  declare recorder?: NonAttribute<User | null>;
}

Examination.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: { type: DataTypes.INTEGER, allowNull: false },
    gearItemId: { type: DataTypes.INTEGER, allowNull: false },
    examinedOn: { type: DataTypes.DATEONLY, allowNull: false },
    examiner: { type: DataTypes.STRING(200), allowNull: false },
    result: { type: DataTypes.STRING(4), allowNull: false },
    defects: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    nextDueOn: { type: DataTypes.DATEONLY, allowNull: false },
    certificateFileId: { type: DataTypes.INTEGER, allowNull: true },
    recordedBy: { type: DataTypes.INTEGER, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "examinations", underscored: true, updatedAt: false },
);

Examination.belongsTo(GearItem, { foreignKey: "gearItemId" });
GearItem.hasMany(Examination, { foreignKey: "gearItemId", as: "examinations" });
Examination.belongsTo(StoredFile, { foreignKey: "certificateFileId", as: "certificate" });
Examination.belongsTo(User, { foreignKey: "recordedBy", as: "recorder" });

/** The item's examinations, latest first, with their certificates and who recorded them. */
export async function listExaminations(organisationId: number, gearItemId: number) {
  return Examination.findAll({
    where: { organisationId, gearItemId },
    include: [
      { model: StoredFile, as: "certificate", attributes: ["id", "originalName", "sizeBytes"] },
      { model: User, as: "recorder", attributes: ["id", "name"] },
    ],
    order: [
      ["examinedOn", "DESC"],
      ["id", "DESC"],
    ],
  });
}

/** The latest examination of an item (by examination date, then by when it was recorded), or null. */
export async function getLatestExamination(organisationId: number, gearItemId: number, transaction?: Transaction) {
  return Examination.findOne({
    where: { organisationId, gearItemId },
    order: [
      ["examinedOn", "DESC"],
      ["id", "DESC"],
    ],
    transaction,
  });
}

/** The latest examination of each of the items, with its certificate's name, by item id. */
export async function latestExaminationsOf(
  organisationId: number,
  gearItemIds: readonly number[],
  transaction?: Transaction,
) {
  const latest = new Map<number, Examination>();
  if (gearItemIds.length === 0) return latest;
  const rows = await Examination.findAll({
    where: { organisationId, gearItemId: [...new Set(gearItemIds)] },
    include: [{ model: StoredFile, as: "certificate", attributes: ["id", "originalName"] }],
    order: [
      ["examinedOn", "DESC"],
      ["id", "DESC"],
    ],
    transaction,
  });
  for (const row of rows) if (!latest.has(row.gearItemId)) latest.set(row.gearItemId, row);
  return latest;
}

export type RecordedExamination = { examination: Examination; nextDueOn: string; quarantined: boolean } | null;

/**
 * Records an examination and its certificate in one transaction. The next due date defaults to
 * LOLER's interval for the item's kind; the item's due date follows its latest examination; a
 * failed examination quarantines an item in service.
 */
export async function recordExamination(
  organisationId: number,
  gearItemId: number,
  fields: ExaminationFields,
  certificate: CheckedUpload | null,
  actorId: number,
): Promise<RecordedExamination> {
  return transactionWithFiles(async (transaction, store) => {
    const item = await GearItem.findOne({ where: { organisationId, id: gearItemId }, transaction });
    if (!item) return null;
    const nextDueOn = fields.nextDueOn ?? defaultNextDue(item.kind, fields.examinedOn);
    const file = certificate
      ? await store(certificate, { organisationId, purpose: "certificate", uploadedBy: actorId })
      : null;
    const examination = await Examination.create(
      {
        organisationId,
        gearItemId,
        examinedOn: fields.examinedOn,
        examiner: fields.examiner,
        result: fields.result,
        defects: fields.defects,
        nextDueOn,
        certificateFileId: file?.id ?? null,
        recordedBy: actorId,
      },
      { transaction },
    );
    const latest = await getLatestExamination(organisationId, gearItemId, transaction);
    if (latest) await item.update({ lastExaminedOn: latest.examinedOn, nextDueOn: latest.nextDueOn }, { transaction });
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: "gear_item",
        entityId: gearItemId,
        action: "examination recorded",
        details: {
          examinationId: examination.id,
          examinedOn: fields.examinedOn,
          result: fields.result,
          nextDueOn,
          examiner: fields.examiner,
        },
      },
      transaction,
    );
    const quarantined = fields.result === "fail" && item.status === "in_service";
    if (quarantined) {
      await setGearStatus(
        item,
        {
          status: "quarantined",
          reason: `Failed thorough examination on ${fields.examinedOn} (${fields.examiner}): ${fields.defects}`,
          actorId,
        },
        transaction,
      );
    }
    return { examination, nextDueOn, quarantined };
  });
}
