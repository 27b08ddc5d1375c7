import { DataTypes, Op } from "sequelize";
import type { Migration } from "../umzug";
import { REFERENCE_TABLES } from "../seeders/reference-data";

/** The tables this migration (re)writes from db/seeders/reference-data.ts. */
const TABLES = ["hitchFactors", "modeFactors", "shackleSideLoad", "wireRope", "ruleSets"] as const;

function rowsOf(tableName: string, tableRows: ReadonlyArray<{ source: string }>) {
  return tableRows.map((row, position) => ({
    table_name: tableName,
    position,
    data: JSON.stringify(row),
    source: row.source,
  }));
}

/**
 * Rule sets: each organisation works to UK/EU or US rules (default UK/EU). Hitch and mode factors and
 * the shackle side-load table gain a row per rule set; the wire rope table takes the published EN
 * 13414-1 Table 4 values where the standard lists the size.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.addColumn("organisations", "rule_set", {
    type: DataTypes.STRING(10),
    allowNull: false,
    defaultValue: "uk-eu",
  });
  await qi.bulkDelete("reference_rows", { table_name: { [Op.in]: [...TABLES] } });
  await qi.bulkInsert(
    "reference_rows",
    TABLES.flatMap((name) => rowsOf(name, REFERENCE_TABLES[name] as ReadonlyArray<{ source: string }>)),
  );
};

// The rows as migration 0005 wrote them, to put back on the way down.
const WIRE_0005 =
  "(memory) EN 13414-1 single-leg WLL, 6x36 IWRC 1770 grade, ferrule-secured eyes; values reconstructed from minimum breaking force (K = 0.356), termination efficiency 0.9 and design factor 5, rounded down; verify against the sling's certificate";
const MODE_0005 = "EN 818-4 / EN 13414-1 mode factors (uniform load method)";
const SINGLE_0005 = "Single leg carries: WLL of one leg (DGUV Regel 100-500)";
const SIDE_0005 =
  "Shackle side load reduction, screw-pin and bolt types (common practice across rigging hardware guidance)";
const HITCH_0005 = [
  { hitch: "straight", factor: 1.0, source: "EN 818-4 / EN 13414-1 / EN 1492-1 straight lift" },
  { hitch: "choke", factor: 0.8, source: "EN 818-4 / EN 13414-1 mode factor for choke hitch" },
  { hitch: "basket", factor: 2.0, source: "EN 1492-1 annex, basket hitch with parallel legs" },
];
const ROWS_0005: Record<string, ReadonlyArray<{ source: string }>> = {
  hitchFactors: HITCH_0005,
  modeFactors: [
    [1, 45, 1.0, SINGLE_0005],
    [1, 60, 1.0, SINGLE_0005],
    [2, 45, 1.4, MODE_0005],
    [2, 60, 1.0, MODE_0005],
    [3, 45, 2.1, MODE_0005],
    [3, 60, 1.5, MODE_0005],
  ].map(([effectiveLegs, upToAngleDeg, factor, source]) => ({
    effectiveLegs,
    upToAngleDeg,
    factor,
    source: source as string,
  })),
  shackleSideLoad: [
    [0, 100],
    [45, 70],
    [90, 50],
  ].map(([upToAngleDeg, percent]) => ({ upToAngleDeg, percent, source: SIDE_0005 })),
  wireRope: [
    [8, 0.7],
    [10, 1.1],
    [12, 1.6],
    [14, 2.2],
    [16, 2.9],
    [18, 3.7],
    [20, 4.6],
    [22, 5.6],
    [24, 6.6],
    [26, 7.8],
    [28, 9.0],
    [32, 11.8],
    [36, 14.9],
    [40, 18.5],
  ].map(([diameterMm, singleLegT]) => ({
    diameterMm,
    singleLegT,
    construction: "6x36 IWRC",
    ropeGradeNmm2: 1770,
    termination: "ferrule-secured",
    source: WIRE_0005,
  })),
};

export const down: Migration = async ({ context: qi }) => {
  await qi.bulkDelete("reference_rows", { table_name: { [Op.in]: [...TABLES] } });
  await qi.bulkInsert(
    "reference_rows",
    Object.entries(ROWS_0005).flatMap(([name, rows]) => rowsOf(name, rows)),
  );
  await qi.removeColumn("organisations", "rule_set");
};
