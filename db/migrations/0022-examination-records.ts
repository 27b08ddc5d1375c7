import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/**
 * A thorough examination as an examiner writes it up: its kind, the report number, the examiner's
 * organisation, the urgency of the defects found (LOLER 1998 reg 10 and Schedule 1) and, where the
 * interval follows a written examination scheme, which scheme.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.addColumn("examinations", "kind", {
    type: DataTypes.STRING(12),
    allowNull: false,
    defaultValue: "periodic",
  });
  await qi.addColumn("examinations", "report_number", {
    type: DataTypes.STRING(100),
    allowNull: false,
    defaultValue: "",
  });
  await qi.addColumn("examinations", "examiner_organisation", {
    type: DataTypes.STRING(200),
    allowNull: false,
    defaultValue: "",
  });
  await qi.addColumn("examinations", "defect_urgency", {
    type: DataTypes.STRING(10),
    allowNull: false,
    defaultValue: "none",
  });
  await qi.addColumn("examinations", "defects_due_by", { type: DataTypes.DATEONLY, allowNull: true });
  await qi.addColumn("examinations", "scheme_reference", {
    type: DataTypes.STRING(200),
    allowNull: false,
    defaultValue: "",
  });
};

export const down: Migration = async ({ context: qi }) => {
  for (const column of [
    "kind",
    "report_number",
    "examiner_organisation",
    "defect_urgency",
    "defects_due_by",
    "scheme_reference",
  ])
    await qi.removeColumn("examinations", column);
};
