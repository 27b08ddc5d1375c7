import type { MassUnit } from "~/statics/units";

/** The kinds of item the gear register holds, in the order forms and filters list them. */
export const GEAR_KINDS = [
  "eyebolt",
  "shackle",
  "chain_sling",
  "wire_rope_sling",
  "web_sling",
  "round_sling",
  "master_link",
  "beam",
  "spreader",
  "chain_block",
  "lever_hoist",
  "hoist",
  "crane",
] as const;
export type GearKind = (typeof GEAR_KINDS)[number];

/** The size fields an item may carry; which apply depends on its kind. */
export const SPEC_FIELDS = [
  "thread",
  "eyeboltFamily",
  "shackleType",
  "pinType",
  "chainGrade",
  "diameterMm",
  "legs",
  "lengthM",
  "hookHeightM",
  "beamMassKg",
  "dropLugsM",
  "topLugsM",
] as const;
export type SpecField = (typeof SPEC_FIELDS)[number];

type KindInfo = {
  label: string;
  /** A lifting accessory in the sense of LOLER 1998 reg 2 (between the machine and the load), else lifting equipment. */
  accessory: boolean;
  fields: readonly SpecField[];
  /** Fields an item of this kind must have. */
  required: readonly SpecField[];
};

export const GEAR_KIND_INFO: Record<GearKind, KindInfo> = {
  eyebolt: {
    label: "Eyebolt",
    accessory: true,
    fields: ["thread", "eyeboltFamily"],
    required: ["thread", "eyeboltFamily"],
  },
  shackle: {
    label: "Shackle",
    accessory: true,
    fields: ["shackleType", "pinType", "diameterMm"],
    required: ["shackleType", "pinType"],
  },
  chain_sling: {
    label: "Chain sling",
    accessory: true,
    fields: ["chainGrade", "diameterMm", "legs", "lengthM"],
    required: ["chainGrade", "diameterMm", "legs", "lengthM"],
  },
  wire_rope_sling: {
    label: "Wire rope sling",
    accessory: true,
    fields: ["diameterMm", "legs", "lengthM"],
    required: ["diameterMm", "legs", "lengthM"],
  },
  web_sling: { label: "Web sling", accessory: true, fields: ["legs", "lengthM"], required: ["lengthM"] },
  round_sling: { label: "Round sling", accessory: true, fields: ["legs", "lengthM"], required: ["lengthM"] },
  master_link: { label: "Master link", accessory: true, fields: ["diameterMm"], required: [] },
  beam: {
    label: "Lifting beam",
    accessory: true,
    fields: ["lengthM", "beamMassKg", "dropLugsM", "topLugsM"],
    required: ["lengthM", "beamMassKg", "dropLugsM", "topLugsM"],
  },
  spreader: {
    label: "Spreader beam",
    accessory: true,
    fields: ["lengthM", "beamMassKg", "dropLugsM", "topLugsM"],
    required: ["lengthM", "beamMassKg", "dropLugsM", "topLugsM"],
  },
  chain_block: {
    label: "Chain block",
    accessory: false,
    fields: ["chainGrade", "diameterMm", "lengthM"],
    required: [],
  },
  lever_hoist: {
    label: "Lever hoist",
    accessory: false,
    fields: ["chainGrade", "diameterMm", "lengthM"],
    required: [],
  },
  hoist: { label: "Powered hoist", accessory: false, fields: ["hookHeightM"], required: [] },
  crane: { label: "Crane or gantry", accessory: false, fields: ["hookHeightM"], required: ["hookHeightM"] },
};

export const SPEC_FIELD_LABELS: Record<SpecField, string> = {
  thread: "Thread",
  eyeboltFamily: "Eyebolt type",
  shackleType: "Shackle shape",
  pinType: "Pin",
  chainGrade: "Chain grade",
  diameterMm: "Diameter (mm)",
  legs: "Legs",
  lengthM: "Length (m)",
  hookHeightM: "Hook height (m)",
  beamMassKg: "Beam mass (kg)",
  dropLugsM: "Drop lugs (m from end)",
  topLugsM: "Top lugs (m from end)",
};

/** Kinds that are beams: a straight member with drop lugs below and top lug(s) above. */
export const BEAM_KINDS = ["beam", "spreader"] as const satisfies readonly GearKind[];
export function isBeamKind(kind: string): kind is (typeof BEAM_KINDS)[number] {
  return (BEAM_KINDS as readonly string[]).includes(kind);
}
/** How many top lugs each beam kind hangs from: a lifting beam from one, a spreader from a 2-leg bridle. */
export const TOP_LUG_COUNT: Record<(typeof BEAM_KINDS)[number], number> = { beam: 1, spreader: 2 };
/** Drops a beam may carry: at least 2, at most the 4 lift points a plan uses. */
export const MAX_DROP_LUGS = 4;

/**
 * Lug positions as written ("0.25, 2.75"): metres along the beam from its end A, separated by commas,
 * semicolons or spaces. Null for text that is not a list of finite numbers.
 */
export function parseLugPositions(text: string | null | undefined): number[] | null {
  if (text === null || text === undefined) return null;
  const parts = text
    .trim()
    .split(/[\s,;]+/)
    .filter((p) => p !== "");
  if (parts.length === 0) return null;
  const values = parts.map((p) => (/^[-+]?(\d+\.?\d*|\.\d+)$/.test(p) ? Number(p) : NaN));
  return values.every((v) => Number.isFinite(v)) ? values : null;
}

/** The stored form of lug positions: ascending, comma-separated, as few digits as they need (0.1 mm). */
export function formatLugPositions(values: readonly number[]): string {
  return [...values]
    .sort((a, b) => a - b)
    .map((v) => String(Math.round(v * 10_000) / 10_000))
    .join(", ");
}

export const EYEBOLT_FAMILIES = ["collar", "shoulder", "plain"] as const;
export const SHACKLE_TYPES = ["bow", "dee"] as const;
export const PIN_TYPES = ["screw", "bolt"] as const;
export const CHAIN_GRADES = [8, 10] as const;

export const GEAR_STATUSES = ["in_service", "quarantined", "withdrawn"] as const;
export type GearStatus = (typeof GEAR_STATUSES)[number];
export const GEAR_STATUS_LABELS: Record<GearStatus, string> = {
  in_service: "In service",
  quarantined: "Quarantined",
  withdrawn: "Withdrawn",
};

/** The units a WLL may be marked in. */
export const WLL_UNITS = ["kg", "t", "lb", "shortTon"] as const satisfies readonly MassUnit[];
export const WLL_UNIT_LABELS: Record<MassUnit, string> = { kg: "kg", t: "t", lb: "lb", shortTon: "US ton" };

export function isGearKind(value: unknown): value is GearKind {
  return typeof value === "string" && (GEAR_KINDS as readonly string[]).includes(value);
}

export function kindLabel(kind: string) {
  return isGearKind(kind) ? GEAR_KIND_INFO[kind].label : kind;
}

export function kindApplies(kind: GearKind, field: SpecField) {
  return GEAR_KIND_INFO[kind].fields.includes(field);
}

type SizeFields = {
  kind: string;
  thread?: string | null;
  eyeboltFamily?: string | null;
  shackleType?: string | null;
  pinType?: string | null;
  chainGrade?: number | null;
  diameterMm?: number | null;
  legs?: number | null;
  lengthM?: number | null;
  hookHeightM?: number | null;
  beamMassKg?: number | null;
  dropLugsM?: string | null;
  topLugsM?: string | null;
};

/** A short size line for lists: "M16 collar", "bow, screw pin, 13 mm", "grade 8, 8 mm, 2 legs, 1.5 m". */
export function sizeSummary(item: SizeFields): string {
  const parts: string[] = [];
  if (item.thread) parts.push(item.eyeboltFamily ? `${item.thread} ${item.eyeboltFamily}` : item.thread);
  else if (item.eyeboltFamily) parts.push(item.eyeboltFamily);
  if (item.shackleType) parts.push(item.shackleType);
  if (item.pinType) parts.push(`${item.pinType} pin`);
  if (item.chainGrade) parts.push(`grade ${item.chainGrade}`);
  if (item.diameterMm) parts.push(`${item.diameterMm} mm`);
  if (item.legs) parts.push(item.legs === 1 ? "1 leg" : `${item.legs} legs`);
  if (item.lengthM) parts.push(`${item.lengthM} m`);
  if (item.hookHeightM) parts.push(`hook ${item.hookHeightM} m`);
  if (item.beamMassKg) parts.push(`beam ${item.beamMassKg} kg`);
  if (item.dropLugsM) parts.push(`drops at ${item.dropLugsM} m`);
  return parts.join(", ");
}

/** What kind of thorough examination this was (LOLER 1998 reg 9; ASME B30.9 / B30.26 inspections). */
export const EXAMINATION_KINDS = ["initial", "periodic", "exceptional", "scheme"] as const;
export type ExaminationKind = (typeof EXAMINATION_KINDS)[number];
export const EXAMINATION_KIND_LABELS: Record<ExaminationKind, string> = {
  initial: "Initial, before first use",
  periodic: "Periodic, within the statutory interval",
  exceptional: "After exceptional circumstances or repair",
  scheme: "Under a written examination scheme",
};

/** How soon the defects found must be put right (LOLER 1998 Schedule 1 paras 6 and 7). */
export const DEFECT_URGENCIES = ["none", "immediate", "by_date"] as const;
export type DefectUrgency = (typeof DEFECT_URGENCIES)[number];
export const DEFECT_URGENCY_LABELS: Record<DefectUrgency, string> = {
  none: "No defect found",
  immediate: "Immediate danger: take out of use now",
  by_date: "Must be put right by a date",
};
