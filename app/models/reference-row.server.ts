import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from "sequelize";
import { sequelize } from "~/utils/db.server";
import type { ReferenceTables } from "~/statics/reference";

/** One row of a published reference table (kept as JSON), with its source. */
export class ReferenceRow extends Model<InferAttributes<ReferenceRow>, InferCreationAttributes<ReferenceRow>> {
  declare id: CreationOptional<number>;
  declare tableName: string;
  declare position: number;
  declare data: string;
  declare source: string;
}

ReferenceRow.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    tableName: { type: DataTypes.STRING(40), allowNull: false },
    position: { type: DataTypes.INTEGER, allowNull: false },
    data: { type: DataTypes.TEXT, allowNull: false },
    source: { type: DataTypes.STRING(500), allowNull: false },
  },
  { sequelize, tableName: "reference_rows", underscored: true, timestamps: false },
);

const TABLE_NAMES: Array<keyof ReferenceTables> = [
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
  "ruleSets",
];

async function readReferenceTables(): Promise<ReferenceTables> {
  const rows = await ReferenceRow.findAll({
    order: [
      ["tableName", "ASC"],
      ["position", "ASC"],
    ],
  });
  const tables = Object.fromEntries(TABLE_NAMES.map((name) => [name, [] as unknown[]])) as Record<string, unknown[]>;
  for (const row of rows) tables[row.tableName]?.push(JSON.parse(row.data));
  const empty = TABLE_NAMES.filter((name) => tables[name]!.length === 0);
  if (empty.length) throw new Error(`Reference tables are missing rows: ${empty.join(", ")}. Run the migrations.`);
  return tables as unknown as ReferenceTables;
}

let cached: Promise<ReferenceTables> | null = null;

/** The reference tables as the checks take them, read from the database once per process. */
export function getReferenceTables(): Promise<ReferenceTables> {
  cached ??= readReferenceTables().catch((error: unknown) => {
    cached = null;
    throw error;
  });
  return cached;
}
