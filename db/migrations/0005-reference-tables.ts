import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";
import { REFERENCE_TABLES } from "../seeders/reference-data";

/** The tables this migration copied when it was written; later tables and changes come with their own migrations. */
const TABLES_0005 = [
  "din580Eyebolts",
  "shoulderEyeboltAngles",
  "shackles",
  "shackleSideLoad",
  "chainGrade8",
  "chainGrade80Us",
  "wireRope",
  "textileColours",
  "hitchFactors",
  "modeFactors",
] as const;

/** The published WLL tables the checks use, one row per table row, each with its source. */
export const up: Migration = async ({ context: qi }) => {
  await qi.createTable("reference_rows", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    table_name: { type: DataTypes.STRING(40), allowNull: false },
    position: { type: DataTypes.INTEGER, allowNull: false },
    data: { type: DataTypes.TEXT, allowNull: false },
    source: { type: DataTypes.STRING(500), allowNull: false },
  });
  await qi.addIndex("reference_rows", ["table_name", "position"], { unique: true });
  const rows = TABLES_0005.flatMap((tableName) =>
    (REFERENCE_TABLES[tableName] as ReadonlyArray<{ source: string }>).map((row, position) => ({
      table_name: tableName,
      position,
      data: JSON.stringify(row),
      source: row.source,
    })),
  );
  await qi.bulkInsert("reference_rows", rows);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("reference_rows");
};
