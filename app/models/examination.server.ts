import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Transaction,
} from "sequelize";
import { defaultNextDue, examinationIntervalMonths, intervalsOf } from "~/gear/due";
import { getOrganisationRuleSet } from "~/models/organisation.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { ruleSetRow } from "~/statics/rule-sets";
import { GEAR_KIND_INFO } from "~/gear/kinds";
import { sequelize } from "~/utils/db.server";
import type { DefectUrgency, ExaminationFields, ExaminationKind } from "~/gear/schema";
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
  declare kind: CreationOptional<ExaminationKind>;
  declare examinedOn: string;
  declare reportNumber: CreationOptional<string>;
  declare examiner: string;
  declare examinerOrganisation: CreationOptional<string>;
  declare result: "pass" | "fail";
  declare defects: CreationOptional<string>;
  declare defectUrgency: CreationOptional<DefectUrgency>;
  declare defectsDueBy: CreationOptional<string | null>;
  declare schemeReference: CreationOptional<string>;
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
    kind: { type: DataTypes.STRING(12), allowNull: false, defaultValue: "periodic" },
    examinedOn: { type: DataTypes.DATEONLY, allowNull: false },
    reportNumber: { type: DataTypes.STRING(100), allowNull: false, defaultValue: "" },
    examiner: { type: DataTypes.STRING(200), allowNull: false },
    examinerOrganisation: { type: DataTypes.STRING(200), allowNull: false, defaultValue: "" },
    result: { type: DataTypes.STRING(4), allowNull: false },
    defects: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    defectUrgency: { type: DataTypes.STRING(10), allowNull: false, defaultValue: "none" },
    defectsDueBy: { type: DataTypes.DATEONLY, allowNull: true },
    schemeReference: { type: DataTypes.STRING(200), allowNull: false, defaultValue: "" },
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

export type RecordedExamination =
  | { ok: true; examination: Examination; nextDueOn: string; quarantined: boolean; released: boolean }
  | { ok: false; field: keyof ExaminationFields; message: string }
  | null;

/**
 * Records an examination and its certificate in one transaction. The next due date defaults to the
 * organisation's rule set's interval for the item's kind (LOLER's 6 / 12 months under UK / EU rules)
 * and may not pass it unless the examination follows a named written scheme; the item's due date follows its latest examination.
 * A failed examination (or one finding a defect of immediate danger) quarantines an item in service;
 * a passed one dated on or after the day a quarantined item was taken out of use returns it to
 * service, recorded against the defect. A withdrawn item stays withdrawn.
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
    const intervals = intervalsOf(
      ruleSetRow(await getReferenceTables(), await getOrganisationRuleSet(organisationId, transaction)),
    );
    const nextDueOn = fields.nextDueOn ?? defaultNextDue(item.kind, fields.examinedOn, intervals);
    const latestAllowed = defaultNextDue(item.kind, fields.examinedOn, intervals);
    if (nextDueOn > latestAllowed && !fields.schemeReference) {
      const months = examinationIntervalMonths(item.kind, intervals);
      const what = GEAR_KIND_INFO[item.kind].accessory ? "a lifting accessory" : "lifting equipment";
      return {
        ok: false,
        field: "nextDueOn",
        message: `Your rules (${intervals.source ?? "the organisation's rule set"}) want ${what} examined at least every ${months} months: the next examination is due by ${latestAllowed} at the latest. A longer interval needs a written examination scheme: name it.`,
      };
    }
    const file = certificate
      ? await store(certificate, { organisationId, purpose: "certificate", uploadedBy: actorId })
      : null;
    const examination = await Examination.create(
      {
        organisationId,
        gearItemId,
        kind: fields.kind,
        examinedOn: fields.examinedOn,
        reportNumber: fields.reportNumber,
        examiner: fields.examiner,
        examinerOrganisation: fields.examinerOrganisation,
        result: fields.result,
        defects: fields.defects,
        defectUrgency: fields.defectUrgency,
        defectsDueBy: fields.defectUrgency === "by_date" ? fields.defectsDueBy : null,
        schemeReference: fields.schemeReference,
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
          kind: fields.kind,
          examinedOn: fields.examinedOn,
          reportNumber: fields.reportNumber,
          result: fields.result,
          defectUrgency: fields.defectUrgency,
          nextDueOn,
          examiner: fields.examiner,
          examinerOrganisation: fields.examinerOrganisation,
          schemeReference: fields.schemeReference,
        },
      },
      transaction,
    );
    const report = [fields.reportNumber && `report ${fields.reportNumber}`, fields.examiner].filter(Boolean).join(", ");
    const fails = fields.result === "fail" || fields.defectUrgency === "immediate";
    const quarantined = fails && item.status === "in_service";
    if (quarantined) {
      await setGearStatus(
        item,
        {
          status: "quarantined",
          reason: `Failed thorough examination on ${fields.examinedOn} (${report}): ${fields.defects}`,
          actorId,
        },
        transaction,
      );
    }
    const quarantinedOn = item.statusChangedAt ? item.statusChangedAt.toISOString().slice(0, 10) : "";
    const released =
      !fails && item.status === "quarantined" && fields.examinedOn >= quarantinedOn && latest?.id === examination.id;
    if (released) {
      await setGearStatus(
        item,
        {
          status: "in_service",
          reason: `Passed thorough examination on ${fields.examinedOn} (${report}) after being quarantined: ${item.statusReason}`,
          actorId,
          action: "returned to service",
          details: { examinationId: examination.id },
        },
        transaction,
      );
    }
    return { ok: true, examination, nextDueOn, quarantined, released };
  });
}
