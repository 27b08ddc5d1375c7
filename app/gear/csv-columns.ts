// The gear register's CSV columns and limits: constants only, so the import page's JavaScript carries no parsing.
import type { GearItemInput } from "~/gear/schema";

/** The largest CSV the import takes; the register's 5,000 items export to well under 1 MB. */
export const MAX_IMPORT_BYTES = 2 * 1024 * 1024;
/** The most rows one import takes. */
export const MAX_IMPORT_ROWS = 10_000;

type EditableColumn = { header: string; field: keyof GearItemInput | "homeSite" };

/** Columns an import reads, in export order. */
export const EDITABLE_COLUMNS: readonly EditableColumn[] = [
  { header: "item_code", field: "itemCode" },
  { header: "kind", field: "kind" },
  { header: "description", field: "description" },
  { header: "manufacturer", field: "manufacturer" },
  { header: "serial", field: "serial" },
  { header: "wll", field: "wllValue" },
  { header: "wll_unit", field: "wllUnit" },
  { header: "thread", field: "thread" },
  { header: "eyebolt_family", field: "eyeboltFamily" },
  { header: "shackle_type", field: "shackleType" },
  { header: "pin_type", field: "pinType" },
  { header: "chain_grade", field: "chainGrade" },
  { header: "diameter_mm", field: "diameterMm" },
  { header: "legs", field: "legs" },
  { header: "length_m", field: "lengthM" },
  { header: "hook_height_m", field: "hookHeightM" },
  { header: "beam_mass_kg", field: "beamMassKg" },
  { header: "drop_lugs_m", field: "dropLugsM" },
  { header: "top_lugs_m", field: "topLugsM" },
  { header: "mass_kg", field: "massKg" },
  { header: "home_site", field: "homeSite" },
];

/** Columns the export adds for reading; an import ignores them (status and examinations change only in the app). */
export const READ_ONLY_COLUMNS = ["wll_kg", "status", "last_examined_on", "next_due_on", "due_state"] as const;

export const CSV_HEADERS = [...EDITABLE_COLUMNS.map((c) => c.header), ...READ_ONLY_COLUMNS];
export const REQUIRED_HEADERS = ["item_code", "kind", "wll", "wll_unit"] as const;
