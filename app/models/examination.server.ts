import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";
import type { DefectUrgency, ExaminationKind } from "~/gear/kinds";
import { GearItem } from "~/models/gear-item.server";
import { StoredFile } from "~/models/stored-file.server";
import { User } from "~/models/user.server";

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
