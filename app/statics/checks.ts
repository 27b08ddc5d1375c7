// Checks of every item in the load path against its working load limit. Pure: reference tables
// and "today" come in as parameters; nothing here reads data or the clock.
import type { BridleSolution, LegResult } from "./bridle";
import {
  chainGrade8PublishedT,
  din580CapacityAtAngle,
  findChainGrade8,
  findDin580Eyebolt,
  findHitchFactor,
  findModeFactor,
  findTextileColour,
  findWireRope,
  normaliseThread,
  rowForAngle,
  TABLE_ANGLE_TOL_DEG,
  type Hitch,
  type ReferenceTables,
  type SlingKind,
} from "./reference";
import { massToKg, type MassUnit } from "./units";
import { dot, norm, type Vec3 } from "./vector";

export type CheckStatus = "pass" | "warn" | "fail";

export interface CheckResult {
  id: string;
  item: string;
  status: CheckStatus;
  /** Load / derated WLL (unrounded), or null where the check is not a load ratio. */
  utilisation: number | null;
  loadKg: number | null;
  capacityKg: number | null;
  rule: string;
  source: string;
  message: string;
}

export interface Wll {
  value: number;
  unit: MassUnit;
}

export type ItemStatus = "in_service" | "quarantined" | "withdrawn";

export interface InspectionRecord {
  itemId: string;
  status: ItemStatus;
  /** Date the next thorough examination is due, YYYY-MM-DD. */
  examinationDue: string;
}

export interface SlingSpec {
  kind: SlingKind;
  wllKg?: number;
  wll?: Wll;
  hitch: Hitch;
  grade?: string;
  diameterMm?: number;
  colour?: string;
  inspection?: InspectionRecord;
}

export interface ShackleSpec {
  wllKg?: number;
  wll?: Wll;
  type: "bow" | "dee";
  pin?: "screw" | "bolt";
  /** Angle between the pull and the shackle's plane of symmetry, deg (0 = in line). */
  sideLoadAngleDeg?: number;
  inspection?: InspectionRecord;
}

export type EyeboltFamily = "collar" | "shoulder" | "plain";

export interface EyeboltSpec {
  family: EyeboltFamily;
  thread: string;
  wllKg?: number;
  wll?: Wll;
  /** False when the eye cannot be turned in line with the pull (default true). */
  eyeAlignedWithPull?: boolean;
  inspection?: InspectionRecord;
}

export interface LegRigging {
  sling?: SlingSpec;
  shackle?: ShackleSpec;
  eyebolt?: EyeboltSpec;
}

export interface SharedShackleSpec {
  legIds: [string, string];
  wllKg?: number;
  wll?: Wll;
  inspection?: InspectionRecord;
}

export interface CraneSpec {
  swlKg: number;
  /** Highest position of the hook's bearing point above the floor, m. */
  maxHookHeightM?: number;
  inspection?: InspectionRecord;
}

export interface HeadroomSpec {
  /** Height the load's underside must reach above the floor, m. */
  clearanceAboveFloorM: number;
  /** z of the load's underside in the component frame, m (default 0). */
  loadUndersideZM?: number;
}

export interface RiggingDescription {
  legs?: Record<string, LegRigging>;
  sharedShackles?: SharedShackleSpec[];
  masterLink?: { wllKg?: number; wll?: Wll; inspection?: InspectionRecord };
  crane?: CraneSpec;
  headroom?: HeadroomSpec;
  /** Contingency on the load mass, % (0..100). */
  contingencyPct?: number;
  /** Mass of slings, shackles, master link, beam etc. carried by the hook, kg. */
  riggingMassKg?: number;
}

export interface LiftPointInfo {
  id: string;
  thread?: string;
}

const EPS = 1e-12;
/** Leg angle from vertical up to which a leg counts as vertical, deg. */
export const VERTICAL_LEG_DEG = 5;
/** Leg angle from vertical above which a check warns, deg. */
export const WARN_LEG_DEG = 45;
/** Leg angle from vertical above which a check fails, deg. */
export const MAX_LEG_DEG = 60;
/** Included angle of two legs on one shackle above which it fails, deg. */
export const MAX_SHACKLE_INCLUDED_DEG = 120;
/** Examination due within this many days gives a warning. */
export const EXAMINATION_WARN_DAYS = 30;

function kg(x: number): string {
  return `${Math.ceil(x - 1e-9).toLocaleString("en-GB")} kg`;
}

function pct(u: number): string {
  // Never round a utilisation down: ceiling to whole percent.
  return `${Math.ceil(u * 100 - 1e-9)} %`;
}

function deg(x: number): string {
  return `${x.toFixed(1)} deg`;
}

function ratioStatus(utilisation: number): CheckStatus {
  return utilisation > 1 + EPS ? "fail" : "pass";
}

function ratioCheck(
  base: Omit<CheckResult, "status" | "utilisation" | "message" | "loadKg" | "capacityKg">,
  loadKg: number,
  capacityKg: number,
  what: string,
): CheckResult {
  const utilisation = capacityKg > 0 ? loadKg / capacityKg : Infinity;
  const status = ratioStatus(utilisation);
  const message =
    status === "pass"
      ? `${base.item} carries ${kg(loadKg)} of its ${kg(capacityKg)} ${what} (${pct(utilisation)}).`
      : `${base.item} would carry ${kg(loadKg)} but is good for only ${kg(capacityKg)} ${what} (${pct(utilisation)}): use a larger item or change the rigging.`;
  return { ...base, status, utilisation, loadKg, capacityKg, message };
}

/** A stated WLL in kg: wllKg, or wll {value, unit}; null when neither is given. */
export function statedWllKg(spec: { wllKg?: number; wll?: Wll }): number | null {
  if (spec.wllKg !== undefined) return spec.wllKg;
  if (spec.wll !== undefined) return massToKg(spec.wll.value, spec.wll.unit);
  return null;
}

/** Single-leg straight-lift WLL of a sling in kg, stated or looked up (chain by diameter, wire by diameter, textile by colour). */
export function resolveSlingWll(spec: SlingSpec, tables: ReferenceTables): { wllKg: number; source: string } | null {
  const stated = statedWllKg(spec);
  if (stated !== null) return { wllKg: stated, source: "marked WLL of the sling" };
  if (spec.kind === "chain" && spec.diameterMm !== undefined) {
    const row = findChainGrade8(tables.chainGrade8, spec.diameterMm);
    if (row) return { wllKg: row.singleLegT * 1000, source: row.source };
  }
  if (spec.kind === "wire" && spec.diameterMm !== undefined) {
    const row = findWireRope(tables.wireRope, spec.diameterMm);
    if (row) return { wllKg: row.singleLegT * 1000, source: row.source };
  }
  if ((spec.kind === "web" || spec.kind === "round") && spec.colour !== undefined) {
    const row = findTextileColour(tables.textileColours, spec.colour);
    if (row && !row.andAbove) return { wllKg: row.wllT * 1000, source: row.source };
  }
  return null;
}

/** Plain name of a sling for messages, e.g. "chain 8 mm". */
export function describeSling(spec: SlingSpec): string {
  const size = spec.diameterMm !== undefined ? ` ${spec.diameterMm} mm` : spec.colour ? ` ${spec.colour}` : "";
  const kind = spec.kind === "web" ? "webbing" : spec.kind === "round" ? "roundsling" : spec.kind === "wire" ? "wire rope" : "chain";
  const hitch = spec.hitch === "straight" ? "" : `, ${spec.hitch} hitch`;
  return `${kind}${size}${hitch}`;
}

/** Sling leg: design leg load (kg, >= 0) against single-leg WLL x hitch factor. */
export function checkSlingLeg(legId: string, designLoadKg: number, spec: SlingSpec, tables: ReferenceTables): CheckResult {
  const item = `Sling leg ${legId} (${describeSling(spec)})`;
  const id = `sling-leg-${legId}`;
  const wll = resolveSlingWll(spec, tables);
  const hitch = findHitchFactor(tables.hitchFactors, spec.hitch);
  if (wll === null || hitch === null) {
    return {
      id, item, status: "fail", utilisation: null, loadKg: designLoadKg, capacityKg: null,
      rule: "WLL x hitch factor", source: hitch?.source ?? "hitch factor table",
      message: `${item} has no known WLL: state its marked WLL (or its size/colour) so it can be checked.`,
    };
  }
  const capacityKg = wll.wllKg * hitch.factor;
  return ratioCheck(
    { id, item, rule: `Leg load vs single-leg WLL ${kg(wll.wllKg)} x hitch factor ${hitch.factor} (${spec.hitch})`, source: `${wll.source}; ${hitch.source}` },
    designLoadKg, capacityKg, "single-leg WLL",
  );
}

/**
 * Whole sling by the uniform load method: load (kg) against the lowest leg WLL x hitch x mode factor for
 * the effective legs and largest angle from vertical; for grade 8 chain also capped by the published table.
 */
export function checkSlingAssembly(
  loadKg: number,
  specs: readonly SlingSpec[],
  effectiveLegs: 1 | 2 | 3,
  maxAngleFromVerticalDeg: number,
  ratingRule: string,
  tables: ReferenceTables,
): CheckResult {
  const id = "sling-assembly";
  const item = `${specs.length}-leg sling`;
  let legCapacity = Infinity;
  let sources = "";
  for (const s of specs) {
    const wll = resolveSlingWll(s, tables);
    const hitch = findHitchFactor(tables.hitchFactors, s.hitch);
    if (wll === null || hitch === null) {
      return {
        id, item, status: "fail", utilisation: null, loadKg, capacityKg: null, rule: ratingRule, source: "mode factor table",
        message: `The ${item} has a leg with no known WLL: state each leg's marked WLL so the sling can be rated.`,
      };
    }
    legCapacity = Math.min(legCapacity, wll.wllKg * hitch.factor);
    sources = wll.source;
  }
  const mode = findModeFactor(tables.modeFactors, effectiveLegs, maxAngleFromVerticalDeg);
  if (mode === null) {
    return {
      id, item, status: "fail", utilisation: null, loadKg, capacityKg: 0, rule: `${ratingRule} No mode factor beyond ${MAX_LEG_DEG} deg from vertical.`,
      source: "EN 818-4 / EN 13414-1 mode factors",
      message: `The ${item} has a leg at ${deg(maxAngleFromVerticalDeg)} from vertical, beyond ${MAX_LEG_DEG} deg, where it has no rating: use longer legs.`,
    };
  }
  let capacityKg = legCapacity * mode.factor;
  let rule = `${ratingRule} Sling WLL = lowest leg WLL ${kg(legCapacity)} x mode factor ${mode.factor} (${effectiveLegs} leg${effectiveLegs > 1 ? "s" : ""} carrying, up to ${mode.upToAngleDeg} deg).`;
  let source = `${mode.source}; ${sources}`;
  // Published chain tables round some multi-leg values below factor x single leg: never exceed them.
  const first = specs[0];
  if (first && first.kind === "chain" && first.diameterMm !== undefined && specs.every((s) => s.kind === "chain" && s.diameterMm === first.diameterMm && statedWllKg(s) === null && s.hitch === first.hitch)) {
    const row = findChainGrade8(tables.chainGrade8, first.diameterMm);
    const hitch = findHitchFactor(tables.hitchFactors, first.hitch);
    const publishedT = row ? chainGrade8PublishedT(row, effectiveLegs, maxAngleFromVerticalDeg) : null;
    if (row && hitch && publishedT !== null && publishedT * 1000 * hitch.factor < capacityKg) {
      capacityKg = publishedT * 1000 * hitch.factor;
      rule += ` Capped at the published table value ${publishedT} t.`;
      source = `${row.source}; ${source}`;
    }
  }
  return ratioCheck({ id, item, rule, source }, loadKg, capacityKg, "sling WLL");
}

/** Leg angle from vertical: <= 5 deg counts vertical, > 45 deg warns, > 60 deg fails. */
export function checkLegAngle(legId: string, angleFromVerticalDeg: number): CheckResult {
  const beta = angleFromVerticalDeg;
  const theta = 90 - beta;
  const item = `Sling leg ${legId}`;
  const base = { id: `angle-${legId}`, item, utilisation: null, loadKg: null, capacityKg: null };
  const source = "29 CFR 1910.184(b) (within 5 deg counts vertical); OSHA Guidance on Safe Sling Use; EN 818-6 practice (beta never above 60 deg)";
  if (beta <= VERTICAL_LEG_DEG + TABLE_ANGLE_TOL_DEG) {
    return { ...base, status: "pass", rule: "Within 5 deg of vertical counts as vertical", source, message: `${item} hangs ${deg(beta)} from vertical and counts as a vertical leg.` };
  }
  if (beta <= WARN_LEG_DEG + TABLE_ANGLE_TOL_DEG) {
    return { ...base, status: "pass", rule: "Leg angle up to 45 deg from vertical", source, message: `${item} hangs ${deg(beta)} from vertical (${deg(theta)} from horizontal).` };
  }
  if (beta <= MAX_LEG_DEG + TABLE_ANGLE_TOL_DEG) {
    return { ...base, status: "warn", rule: "Leg angle 45-60 deg from vertical: reduced rating", source, message: `${item} hangs ${deg(beta)} from vertical, over 45 deg: the sling's rating drops; longer legs would lower the leg loads.` };
  }
  return { ...base, status: "fail", rule: "Leg angle over 60 deg from vertical (under 30 deg from horizontal)", source, message: `${item} hangs ${deg(beta)} from vertical (${deg(theta)} from horizontal), beyond 60 deg: use longer legs or a beam.` };
}

/** Eyebolt: leg load (kg) against the derated WLL for the angle (deg) between leg and bolt axis; thread must match. */
export function checkEyebolt(
  legId: string,
  designLoadKg: number,
  axisAngleDeg: number,
  spec: EyeboltSpec,
  liftPointThread: string | undefined,
  tables: ReferenceTables,
): CheckResult {
  const familyName = spec.family === "collar" ? "collar eyebolt" : spec.family === "shoulder" ? "shoulder eyebolt" : "plain eyebolt";
  const item = `Eyebolt at ${legId} (${spec.thread} ${familyName})`;
  const id = `eyebolt-${legId}`;
  const failWith = (rule: string, source: string, message: string, capacityKg: number | null = null): CheckResult => ({
    id, item, status: "fail", utilisation: capacityKg === null ? null : designLoadKg / Math.max(capacityKg, EPS), loadKg: designLoadKg, capacityKg, rule, source, message,
  });
  if (liftPointThread !== undefined && normaliseThread(liftPointThread) !== normaliseThread(spec.thread)) {
    return failWith("Eyebolt thread must match the tapped hole", "common practice", `${item} does not fit lift point ${legId}, which is tapped ${liftPointThread}: use a ${liftPointThread} eyebolt.`);
  }
  const aligned = spec.eyeAlignedWithPull ?? true;
  const angle = axisAngleDeg;
  if (angle > 90 + TABLE_ANGLE_TOL_DEG) {
    return failWith("Pull more than 90 deg from the bolt axis", "DIN 580; ASME B30.26", `${item} would be pulled ${deg(angle)} from its axis, back toward the surface: re-rig so the leg leads away from the surface.`);
  }
  let capacityKg: number;
  let rule: string;
  let source: string;
  const stated = statedWllKg(spec);
  if (spec.family === "plain") {
    if (angle > VERTICAL_LEG_DEG + TABLE_ANGLE_TOL_DEG) {
      return failWith("Plain eyebolts: in-line pull only", "ASME B30.26", `${item} is pulled ${deg(angle)} off its axis; a plain eyebolt takes in-line pull only: use a collar or shoulder eyebolt, or a vertical leg.`);
    }
    if (stated === null) return failWith("Marked WLL required", "ASME B30.26", `${item} has no stated WLL: give its marked WLL.`);
    capacityKg = stated;
    rule = "Plain eyebolt, in-line pull (within 5 deg)";
    source = "ASME B30.26";
  } else {
    if (!aligned && angle > VERTICAL_LEG_DEG + TABLE_ANGLE_TOL_DEG) {
      return failWith("Angled pull must lie in the plane of the eye", spec.family === "collar" ? "DIN 580" : "ASME B30.26", `${item} is pulled ${deg(angle)} off its axis out of the plane of its eye: turn the eye in line with the pull (shim the collar) or use a swivel lifting point.`);
    }
    if (spec.family === "collar") {
      const row = findDin580Eyebolt(tables.din580Eyebolts, spec.thread);
      if (row === null) {
        if (angle <= TABLE_ANGLE_TOL_DEG && stated !== null) {
          capacityKg = stated;
          rule = "Collar eyebolt, axial pull, marked WLL";
          source = "marked WLL";
        } else {
          return failWith("DIN 580 table", "DIN 580", `${item}: thread ${spec.thread} is not in the DIN 580 table, so its angled rating is unknown: give a tabulated size.`);
        }
      } else {
        const at = din580CapacityAtAngle(row, angle);
        if (at === null) return failWith("DIN 580 table", row.source, `${item} is pulled ${deg(angle)} from its axis, beyond the table.`);
        // A marked WLL different from the table scales the whole row (never above the marking).
        const scaleToMarked = stated !== null ? Math.min(1, stated / row.axialKg) : 1;
        capacityKg = at.capacityKg * scaleToMarked;
        rule = `DIN 580 ${at.column} column (next larger tabulated angle; never interpolated); per eyebolt, not added up for multi-leg lifts`;
        source = row.source;
      }
    } else {
      if (stated === null) return failWith("Marked WLL required", "ASME B18.15-type table", `${item} has no stated WLL: give its marked WLL.`);
      const row = rowForAngle(tables.shoulderEyeboltAngles, angle);
      if (row === null) return failWith("Shoulder eyebolt angle table", "ASME B18.15-type table", `${item} is pulled ${deg(angle)} from its axis, beyond the table.`);
      capacityKg = (stated * row.percent) / 100;
      rule = `Shoulder eyebolt at ${deg(angle)}: ${row.percent} % of marked WLL (row up to ${row.upToAngleDeg} deg, next larger tabulated angle)`;
      source = row.source;
    }
  }
  const result = ratioCheck({ id, item, rule, source }, designLoadKg, capacityKg, "derated WLL");
  if (liftPointThread === undefined && result.status === "pass") {
    return { ...result, status: "warn", message: `${result.message} The lift point's thread is not recorded: confirm the eyebolt fits its hole with full engagement.` };
  }
  return result;
}

/** Shackle at a lift point: leg load (kg) against WLL reduced for side load (45 deg 70 %, 90 deg 50 %). */
export function checkShackle(legId: string, designLoadKg: number, spec: ShackleSpec, tables: ReferenceTables): CheckResult {
  const item = `Shackle at ${legId} (${spec.type}${spec.pin ? `, ${spec.pin} pin` : ""})`;
  const id = `shackle-${legId}`;
  const wllKg = statedWllKg(spec);
  const side = spec.sideLoadAngleDeg ?? 0;
  const row = rowForAngle(tables.shackleSideLoad, side);
  if (wllKg === null || row === null) {
    return {
      id, item, status: "fail", utilisation: null, loadKg: designLoadKg, capacityKg: null, rule: "Shackle WLL with side-load reduction",
      source: row?.source ?? "shackle side load table",
      message: wllKg === null ? `${item} has no stated WLL: give its marked WLL.` : `${item} is side-loaded ${deg(side)}, beyond the table: re-rig so the shackle takes the load in line.`,
    };
  }
  const capacityKg = (wllKg * row.percent) / 100;
  return ratioCheck(
    { id, item, rule: `Side load ${deg(side)}: ${row.percent} % of WLL (next larger tabulated angle)`, source: row.source },
    designLoadKg, capacityKg, "derated WLL",
  );
}

/** Two legs on one shackle: resultant load (kg) against WLL; included angle over 120 deg fails. */
export function checkSharedShackle(index: number, legA: LegResult, legB: LegResult, loadFactor: number, spec: SharedShackleSpec): CheckResult {
  const item = `Shackle joining legs ${legA.liftPointId} and ${legB.liftPointId}`;
  const id = `shared-shackle-${index + 1}`;
  const a: Vec3 = legA.direction;
  const b: Vec3 = legB.direction;
  const included = (Math.atan2(norm({ x: a.y * b.z - a.z * b.y, y: a.z * b.x - a.x * b.z, z: a.x * b.y - a.y * b.x }), dot(a, b)) * 180) / Math.PI;
  const ta = legA.tensionKg * loadFactor;
  const tb = legB.tensionKg * loadFactor;
  const resultantKg = norm({ x: ta * a.x + tb * b.x, y: ta * a.y + tb * b.y, z: ta * a.z + tb * b.z });
  const wllKg = statedWllKg(spec);
  const source = "Two legs on one shackle: included angle at most 120 deg (common practice across rigging hardware guidance)";
  if (included > MAX_SHACKLE_INCLUDED_DEG + TABLE_ANGLE_TOL_DEG) {
    return {
      id, item, status: "fail", utilisation: wllKg ? resultantKg / wllKg : null, loadKg: resultantKg, capacityKg: wllKg, rule: "Included angle at most 120 deg", source,
      message: `${item} has the legs ${deg(included)} apart, over 120 deg: use longer legs or a shackle per leg on a master link.`,
    };
  }
  if (wllKg === null) {
    return { id, item, status: "fail", utilisation: null, loadKg: resultantKg, capacityKg: null, rule: "Shackle WLL", source, message: `${item} has no stated WLL: give its marked WLL.` };
  }
  return ratioCheck({ id, item, rule: `Resultant of both legs (${deg(included)} included) vs WLL`, source }, resultantKg, wllKg, "WLL");
}

/** Master link or top fitting: the total hook load (kg) against its WLL. */
export function checkMasterLink(hookLoadKg: number, spec: { wllKg?: number; wll?: Wll }): CheckResult {
  const item = "Master link";
  const wllKg = statedWllKg(spec);
  if (wllKg === null) {
    return { id: "master-link", item, status: "fail", utilisation: null, loadKg: hookLoadKg, capacityKg: null, rule: "Total hook load vs WLL", source: "marked WLL", message: "The master link has no stated WLL: give its marked WLL." };
  }
  return ratioCheck({ id: "master-link", item, rule: "Total hook load (load with contingency plus rigging) vs WLL", source: "marked WLL" }, hookLoadKg, wllKg, "WLL");
}

/** Crane or hoist: gross load (kg) = mass x (1 + contingency) + rigging mass, against SWL. */
export function checkCraneLoad(grossLoadKg: number, crane: CraneSpec): CheckResult {
  return ratioCheck(
    { id: "crane-load", item: "Crane or hoist", rule: "Gross load = mass x (1 + contingency) + rigging mass (+ beam) <= SWL", source: "LOLER reg 8; ASME P30.1 ch. 5 (gross load including rigging)" },
    grossLoadKg, crane.swlKg, "safe working load",
  );
}

/** Hook headroom: hook height needed over the floor (m) against the hook's highest position (m). */
export function checkHeadroom(neededHookHeightM: number, maxHookHeightM: number): CheckResult {
  const utilisation = maxHookHeightM > 0 ? neededHookHeightM / maxHookHeightM : Infinity;
  const ok = neededHookHeightM <= maxHookHeightM + 1e-9;
  const need = `${Math.ceil(neededHookHeightM * 1000 - 1e-6)} mm`;
  const have = `${Math.floor(maxHookHeightM * 1000 + 1e-6)} mm`;
  return {
    id: "crane-headroom", item: "Crane hook headroom", status: ok ? "pass" : "fail", utilisation, loadKg: null, capacityKg: null,
    rule: "Hook height needed over the floor <= hook's highest position", source: "LOLER reg 8; BS 7121 (planning the lift path)",
    message: ok
      ? `Crane hook headroom: the hook must reach ${need} above the floor and can reach ${have}.`
      : `Crane hook headroom: the hook must reach ${need} above the floor but can reach only ${have}: shorten the legs, use a beam, or lift with a different crane.`,
  };
}

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Days since 1970-01-01 for a YYYY-MM-DD date, or null when invalid. */
export function isoDateToDay(iso: string): number | null {
  const m = ISO_DATE.exec(iso);
  if (!m) return null;
  const y = Number(m[1]);
  const mo = Number(m[2]);
  const d = Number(m[3]);
  const t = Date.UTC(y, mo - 1, d);
  const back = new Date(t);
  if (back.getUTCFullYear() !== y || back.getUTCMonth() !== mo - 1 || back.getUTCDate() !== d) return null;
  return Math.round(t / 86_400_000);
}

/** Inspection status of an allocated item on todayIso (YYYY-MM-DD): in service and in date for thorough examination. */
export function checkInspection(itemName: string, record: InspectionRecord, todayIso: string): CheckResult {
  const base = {
    id: `inspection-${record.itemId}`, item: `${itemName} (${record.itemId})`, utilisation: null, loadKg: null, capacityKg: null,
    rule: "In service and in date for thorough examination", source: "UK LOLER 1998 reg 9(3); ASME B30.9 / B30.26 periodic inspection",
  };
  if (record.status !== "in_service") {
    return { ...base, status: "fail", message: `${base.item} is ${record.status === "quarantined" ? "quarantined" : "withdrawn"}: allocate another item; the plan cannot be approved with it.` };
  }
  const due = isoDateToDay(record.examinationDue);
  const today = isoDateToDay(todayIso);
  if (due === null || today === null) {
    return { ...base, status: "fail", message: `${base.item} has no valid examination due date: record its last thorough examination.` };
  }
  if (due < today) {
    return { ...base, status: "fail", message: `${base.item} was due for thorough examination on ${record.examinationDue} and is overdue: have it examined or allocate another item.` };
  }
  if (due - today <= EXAMINATION_WARN_DAYS) {
    return { ...base, status: "warn", message: `${base.item} is due for thorough examination on ${record.examinationDue}, within ${EXAMINATION_WARN_DAYS} days.` };
  }
  return { ...base, status: "pass", message: `${base.item} is in service and in date until ${record.examinationDue}.` };
}

/** Fraction applied to the load for contingency: 1 + pct/100. */
export function contingencyFactor(contingencyPct: number | undefined): number {
  return 1 + (contingencyPct ?? 0) / 100;
}

/**
 * Every check for a solved bridle and its rigging description. Leg loads use the rating's design
 * tensions (elastic or rule, whichever is larger) times the contingency factor.
 */
export function checkRigging(
  solution: BridleSolution,
  massKg: number,
  cog: Vec3,
  liftPoints: readonly LiftPointInfo[],
  rigging: RiggingDescription,
  tables: ReferenceTables,
  todayIso?: string,
): CheckResult[] {
  const results: CheckResult[] = [];
  const factor = contingencyFactor(rigging.contingencyPct);
  const designLoadKg = massKg * factor;
  const riggingKg = rigging.riggingMassKg ?? 0;
  const inspections: Array<{ name: string; record: InspectionRecord }> = [];
  const legsRigging = rigging.legs ?? {};
  const slingSpecs: SlingSpec[] = [];
  for (let i = 0; i < solution.legs.length; i++) {
    const leg = solution.legs[i]!;
    const id = leg.liftPointId;
    const design = solution.rating.legs[i]?.designTensionKg ?? leg.tensionKg;
    const legLoadKg = design * factor;
    const lr = Object.hasOwn(legsRigging, id) ? legsRigging[id] : undefined;
    if (!leg.slack) results.push(checkLegAngle(id, leg.angleFromVerticalDeg));
    if (lr?.sling) {
      slingSpecs.push(lr.sling);
      results.push(checkSlingLeg(id, legLoadKg, lr.sling, tables));
      if (lr.sling.inspection) inspections.push({ name: `Sling leg ${id}`, record: lr.sling.inspection });
    }
    if (lr?.shackle) {
      results.push(checkShackle(id, legLoadKg, lr.shackle, tables));
      if (lr.shackle.inspection) inspections.push({ name: `Shackle at ${id}`, record: lr.shackle.inspection });
    }
    if (lr?.eyebolt) {
      const thread = liftPoints.find((p) => p.id === id)?.thread;
      results.push(checkEyebolt(id, legLoadKg, leg.axisAngleDeg, lr.eyebolt, thread, tables));
      if (lr.eyebolt.inspection) inspections.push({ name: `Eyebolt at ${id}`, record: lr.eyebolt.inspection });
    }
  }
  if (solution.legs.length >= 2 && slingSpecs.length === solution.legs.length) {
    results.push(
      checkSlingAssembly(designLoadKg, slingSpecs, solution.rating.effectiveLegs, solution.rating.maxAngleFromVerticalDeg, solution.rating.rule, tables),
    );
  }
  (rigging.sharedShackles ?? []).forEach((s, index) => {
    const a = solution.legs.find((l) => l.liftPointId === s.legIds[0]);
    const b = solution.legs.find((l) => l.liftPointId === s.legIds[1]);
    if (a && b) results.push(checkSharedShackle(index, a, b, factor, s));
    if (s.inspection) inspections.push({ name: `Shackle joining legs ${s.legIds[0]} and ${s.legIds[1]}`, record: s.inspection });
  });
  const hookLoadKg = designLoadKg + riggingKg;
  if (rigging.masterLink) {
    results.push(checkMasterLink(hookLoadKg, rigging.masterLink));
    if (rigging.masterLink.inspection) inspections.push({ name: "Master link", record: rigging.masterLink.inspection });
  }
  if (rigging.crane) {
    results.push(checkCraneLoad(hookLoadKg, rigging.crane));
    if (rigging.crane.inspection) inspections.push({ name: "Crane or hoist", record: rigging.crane.inspection });
    if (rigging.crane.maxHookHeightM !== undefined && rigging.headroom) {
      const underside = { x: cog.x, y: cog.y, z: rigging.headroom.loadUndersideZM ?? 0 };
      const h = solution.hook;
      const v = solution.vertical;
      // Vertical distance from the load's underside (below the CoG) up to the hook point.
      const drop = (h.x - underside.x) * v.x + (h.y - underside.y) * v.y + (h.z - underside.z) * v.z;
      results.push(checkHeadroom(rigging.headroom.clearanceAboveFloorM + drop, rigging.crane.maxHookHeightM));
    }
  }
  if (todayIso !== undefined) {
    for (const { name, record } of inspections) results.push(checkInspection(name, record, todayIso));
  }
  return results;
}
