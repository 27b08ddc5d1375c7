// Types of the reference tables (rows seeded into the database, passed in at runtime) and pure
// lookups over them. Nothing here imports the data: callers pass the rows.
import { massToKg, type MassUnit } from "./units";

export type SlingKind = "chain" | "wire" | "web" | "round";
export type Hitch = "straight" | "choke" | "basket";

/** The rules an organisation works to: UK/EU (LOLER, EN, DIN) or US (ASME B30, OSHA). */
export const RULE_SET_IDS = ["uk-eu", "us"] as const;
export type RuleSetId = (typeof RULE_SET_IDS)[number];
export const DEFAULT_RULE_SET: RuleSetId = "uk-eu";

/** How a family of eyebolt is derated for angled pull under a rule set. */
export type EyeboltMethod = "din580" | "shoulder-percent" | "in-line-only";

/** One rule set: its limits and which tables it rates with. Factors live in the rows that name the set. */
export interface RuleSetRow {
  id: RuleSetId;
  name: string;
  /** The standards the set works to, in one line. */
  standards: string;
  /** Leg angle from vertical counted as vertical, above which it warns, above which it fails, deg. */
  verticalDeg: number;
  warnDeg: number;
  maxDeg: number;
  angleSource: string;
  collarEyebolts: EyeboltMethod;
  shoulderEyebolts: EyeboltMethod;
  plainEyebolts: EyeboltMethod;
  eyeboltSource: string;
  /** Longest interval between thorough examinations without a scheme, months. */
  accessoryExaminationMonths: number;
  equipmentExaminationMonths: number;
  examinationSource: string;
  /** Largest included angle of two legs on one shackle, deg. */
  sharedShackleMaxDeg: number;
  source: string;
}

/** DIN 580 collar eyebolt capacity per eyebolt, kg. */
export interface Din580EyeboltRow {
  thread: string;
  axialKg: number;
  upTo45Kg: number;
  at90Kg: number;
  source: string;
}

/** Percentage of rated load up to an angle (inclusive); used for shoulder eyebolts and shackle side load. */
export interface AnglePercentRow {
  /** Set for tables that differ by rule set (shackle side load); absent where one table serves both. */
  ruleSet?: RuleSetId;
  upToAngleDeg: number;
  percent: number;
  source: string;
}

export interface ShackleRow {
  standard: "EN 13889" | "RR-C-271";
  wll: number;
  unit: "t" | "shortTon";
  source: string;
}

/** EN 818-4 grade 8 chain sling WLL, tonnes: single leg and the published multi-leg columns. */
export interface ChainGrade8Row {
  diameterMm: number;
  singleLegT: number;
  twoLegUpTo45T: number;
  twoLeg45To60T: number;
  multiLegUpTo45T: number;
  multiLeg45To60T: number;
  source: string;
}

/** US grade 80 chain rated loads, lb, by horizontal angle theta. */
export interface ChainGrade80UsRow {
  diameterIn: number;
  singleLb: number;
  double60Lb: number;
  double45Lb: number;
  double30Lb: number;
  triple60Lb: number;
  triple45Lb: number;
  triple30Lb: number;
  source: string;
}

export interface WireRopeRow {
  diameterMm: number;
  singleLegT: number;
  /** Published multi-leg columns (EN 13414-1 Table 4), where the source gives them, tonnes. */
  twoLegUpTo45T?: number;
  twoLeg45To60T?: number;
  multiLegUpTo45T?: number;
  multiLeg45To60T?: number;
  endlessChokeT?: number;
  construction: string;
  ropeGradeNmm2: number;
  termination: string;
  source: string;
}

export interface TextileColourRow {
  colour: string;
  wllT: number;
  /** True for the top colour, which covers this WLL and above (the label gives the exact WLL). */
  andAbove: boolean;
  source: string;
}

export interface HitchFactorRow {
  ruleSet: RuleSetId;
  hitch: Hitch;
  factor: number;
  source: string;
}

/** Multi-leg mode factor by how many legs are taken to carry and the largest leg angle from vertical. */
export interface ModeFactorRow {
  ruleSet: RuleSetId;
  effectiveLegs: 1 | 2 | 3;
  upToAngleDeg: number;
  factor: number;
  source: string;
}

export interface ReferenceTables {
  din580Eyebolts: readonly Din580EyeboltRow[];
  shoulderEyeboltAngles: readonly AnglePercentRow[];
  shackles: readonly ShackleRow[];
  shackleSideLoad: readonly AnglePercentRow[];
  chainGrade8: readonly ChainGrade8Row[];
  chainGrade80Us: readonly ChainGrade80UsRow[];
  wireRope: readonly WireRopeRow[];
  textileColours: readonly TextileColourRow[];
  hitchFactors: readonly HitchFactorRow[];
  modeFactors: readonly ModeFactorRow[];
  ruleSets: readonly RuleSetRow[];
}

/** Angles within this of a tabulated angle count as that angle (rounding only), deg. */
export const TABLE_ANGLE_TOL_DEG = 1e-6;

/** Row for angleDeg (0..180) by the next-larger-tabulated-angle rule; null beyond the table. */
export function rowForAngle<T extends { upToAngleDeg: number }>(rows: readonly T[], angleDeg: number): T | null {
  if (!Number.isFinite(angleDeg)) return null;
  let best: T | null = null;
  for (const row of rows) {
    if (angleDeg <= row.upToAngleDeg + TABLE_ANGLE_TOL_DEG && (best === null || row.upToAngleDeg < best.upToAngleDeg))
      best = row;
  }
  return best;
}

/** Normalises a thread designation: " m16 " -> "M16", "M16x1.5" kept as "M16X1.5". */
export function normaliseThread(thread: string): string {
  return thread.trim().toUpperCase().replace(/\s+/g, "");
}

/** DIN 580 row for a thread such as "M16", or null. */
export function findDin580Eyebolt(rows: readonly Din580EyeboltRow[], thread: string): Din580EyeboltRow | null {
  const t = normaliseThread(thread);
  return rows.find((r) => normaliseThread(r.thread) === t) ?? null;
}

export interface AngleCapacity {
  capacityKg: number;
  column: "axial" | "up to 45 deg" | "90 deg";
}

/** DIN 580 capacity (kg) at angleDeg between pull and bolt axis, next larger tabulated angle; null beyond 90. */
export function din580CapacityAtAngle(row: Din580EyeboltRow, angleDeg: number): AngleCapacity | null {
  if (!(angleDeg >= 0)) return null;
  if (angleDeg <= TABLE_ANGLE_TOL_DEG) return { capacityKg: row.axialKg, column: "axial" };
  if (angleDeg <= 45 + TABLE_ANGLE_TOL_DEG) return { capacityKg: row.upTo45Kg, column: "up to 45 deg" };
  if (angleDeg <= 90 + TABLE_ANGLE_TOL_DEG) return { capacityKg: row.at90Kg, column: "90 deg" };
  return null;
}

/** Hitch factor for a hitch under a rule set, or null when the table lacks it. */
export function findHitchFactor(
  rows: readonly HitchFactorRow[],
  hitch: Hitch,
  ruleSet: RuleSetId = DEFAULT_RULE_SET,
): HitchFactorRow | null {
  return rows.find((r) => r.hitch === hitch && r.ruleSet === ruleSet) ?? null;
}

/** Mode factor row for effective legs and the largest angle from vertical (deg) under a rule set; null beyond its table. */
export function findModeFactor(
  rows: readonly ModeFactorRow[],
  effectiveLegs: 1 | 2 | 3,
  maxAngleFromVerticalDeg: number,
  ruleSet: RuleSetId = DEFAULT_RULE_SET,
): ModeFactorRow | null {
  return rowForAngle(
    rows.filter((r) => r.effectiveLegs === effectiveLegs && r.ruleSet === ruleSet),
    maxAngleFromVerticalDeg,
  );
}

/** Shackle side-load row for an angle (deg) under a rule set, next larger tabulated angle; null beyond the table. */
export function findShackleSideLoad(
  rows: readonly AnglePercentRow[],
  angleDeg: number,
  ruleSet: RuleSetId = DEFAULT_RULE_SET,
): AnglePercentRow | null {
  return rowForAngle(
    rows.filter((r) => (r.ruleSet ?? DEFAULT_RULE_SET) === ruleSet),
    angleDeg,
  );
}

/** The rule set row for an id; throws when the tables lack it (a migration is missing). */
export function requireRuleSet(rows: readonly RuleSetRow[], id: RuleSetId): RuleSetRow {
  const row = rows.find((r) => r.id === id);
  if (!row) throw new Error(`The reference tables have no rule set "${id}".`);
  return row;
}

export function isRuleSetId(value: unknown): value is RuleSetId {
  return typeof value === "string" && (RULE_SET_IDS as readonly string[]).includes(value);
}

/** EN 818-4 grade 8 row by chain diameter (mm), or null. */
export function findChainGrade8(rows: readonly ChainGrade8Row[], diameterMm: number): ChainGrade8Row | null {
  return rows.find((r) => Math.abs(r.diameterMm - diameterMm) < 1e-9) ?? null;
}

type PublishedColumns = {
  singleLegT: number;
  twoLegUpTo45T?: number;
  twoLeg45To60T?: number;
  multiLegUpTo45T?: number;
  multiLeg45To60T?: number;
};

/** Published multi-leg WLL (t) of an EN 818-4 / EN 13414-1 row for effective legs and angle, or null when not tabulated. */
export function publishedMultiLegT(
  row: PublishedColumns,
  effectiveLegs: 1 | 2 | 3,
  maxAngleFromVerticalDeg: number,
): number | null {
  const upTo45 = maxAngleFromVerticalDeg <= 45 + TABLE_ANGLE_TOL_DEG;
  const upTo60 = maxAngleFromVerticalDeg <= 60 + TABLE_ANGLE_TOL_DEG;
  if (!upTo60) return null;
  if (effectiveLegs === 1) return row.singleLegT;
  if (effectiveLegs === 2) return (upTo45 ? row.twoLegUpTo45T : row.twoLeg45To60T) ?? null;
  return (upTo45 ? row.multiLegUpTo45T : row.multiLeg45To60T) ?? null;
}

/** Published EN 818-4 multi-leg WLL (t) for effective legs and angle, or null when not tabulated. */
export function chainGrade8PublishedT(
  row: ChainGrade8Row,
  effectiveLegs: 1 | 2 | 3,
  maxAngleFromVerticalDeg: number,
): number | null {
  return publishedMultiLegT(row, effectiveLegs, maxAngleFromVerticalDeg);
}

/** Wire rope sling row by rope diameter (mm), or null. */
export function findWireRope(rows: readonly WireRopeRow[], diameterMm: number): WireRopeRow | null {
  return rows.find((r) => Math.abs(r.diameterMm - diameterMm) < 1e-9) ?? null;
}

/** Textile sling row by colour (case-insensitive, "grey"/"gray" alike), or null. */
export function findTextileColour(rows: readonly TextileColourRow[], colour: string): TextileColourRow | null {
  const c = colour.trim().toLowerCase().replace("gray", "grey");
  return rows.find((r) => r.colour.toLowerCase() === c) ?? null;
}

/** Textile colour for a straight-lift WLL in tonnes, or null when no colour matches. */
export function textileColourForWll(rows: readonly TextileColourRow[], wllT: number): TextileColourRow | null {
  return rows.find((r) => (r.andAbove ? wllT >= r.wllT : Math.abs(r.wllT - wllT) < 1e-9)) ?? null;
}

/** Shackle WLL of a table row, kg (the row states its unit). */
export function shackleRowWllKg(row: ShackleRow): number {
  return massToKg(row.wll, row.unit);
}

/** A stated WLL {value, unit} in kg. */
export function wllToKg(value: number, unit: MassUnit): number {
  return massToKg(value, unit);
}

/** US-practice multi-leg rated load: single-leg rating x legs (2, or 3 for triple/quad) x sin(theta), theta from horizontal, deg. */
export function usMultiLegRatedLoad(singleLegRating: number, legs: 2 | 3 | 4, angleFromHorizontalDeg: number): number {
  const carrying = legs === 2 ? 2 : 3;
  return singleLegRating * carrying * Math.sin((angleFromHorizontalDeg * Math.PI) / 180);
}
