// Fittings at the lift points: eyebolts (derated by the pull's angle to the bolt axis, its eye set by
// the geometry), shackles (side load from the geometry) and two legs sharing one shackle.
import type { LegResult } from "./bridle";
import type {
  Check,
  EyeAlignmentSource,
  EyeboltSpec,
  EyePlane,
  ShackleSpec,
  SharedShackleSpec,
  SideLoadSource,
} from "./check-types";
import { EPS, failCheck, markedWll, ratioCheck, statedWllKg, type CheckBase } from "./checks-common";
import {
  DEFAULT_RULE_SET,
  din580CapacityAtAngle,
  findDin580Eyebolt,
  findShackleSideLoad,
  normaliseThread,
  rowForAngle,
  TABLE_ANGLE_TOL_DEG,
  type ReferenceTables,
  type RuleSetId,
} from "./reference";
import { eyeboltMethod, ruleSetRow } from "./rule-sets";
import { cross, dot, norm, normalize, type Vec3 } from "./vector";

/** A pull within this of the eye's plane counts as in the plane, deg (common practice, as for vertical legs). */
export const IN_PLANE_TOL_DEG = 5;
/** Included angle of two legs on one shackle above which it fails, deg (when no rule set is given). */
export const MAX_SHACKLE_INCLUDED_DEG = 120;
/** Pull angle to the bolt axis within which a plain eyebolt counts as in line, deg. */
const IN_LINE_DEG = 5;

const deg = (rad: number) => (rad * 180) / Math.PI;

/**
 * Angle (deg, 0..90) between a pull and the plane that holds the bolt axis and a direction fixed on
 * the component (x or y, projected square to the axis). Null when the direction lies along the axis.
 */
export function angleOutOfPlaneDeg(pull: Vec3, axis: Vec3, along: "x" | "y"): number | null {
  const d: Vec3 = along === "x" ? { x: 1, y: 0, z: 0 } : { x: 0, y: 1, z: 0 };
  const a = normalize(axis);
  const p = normalize(pull);
  if (!a || !p) return null;
  const normal = normalize(cross(a, d), 1e-9);
  if (!normal) return null;
  return deg(Math.asin(Math.min(1, Math.abs(dot(p, normal)))));
}

export interface EyeGeometry {
  /** Unit pull direction from the lift point toward the hook, component frame. */
  pull: Vec3;
  /** Unit bolt axis (out of the surface), component frame. */
  axis: Vec3;
  /** The eye's plane as the planner set it; absent or "pull": set by the product where the family allows. */
  plane?: EyePlane;
}

/** How the eye faces the pull: who set it and how far the pull leaves its plane, deg. */
export function eyeAlignment(
  spec: Pick<EyeboltSpec, "family" | "eyeAlignedWithPull">,
  geometry: EyeGeometry | undefined,
  axisAngleDeg: number,
) {
  if (spec.eyeAlignedWithPull === false) {
    // Out of line by an unknown amount: take the worst, the whole inclination out of the plane.
    return { source: "given-not-aligned" as EyeAlignmentSource, outOfPlaneDeg: axisAngleDeg };
  }
  if (spec.family === "plain") return { source: "not-applicable" as EyeAlignmentSource, outOfPlaneDeg: 0 };
  if (geometry && (geometry.plane === "x" || geometry.plane === "y")) {
    const out = angleOutOfPlaneDeg(geometry.pull, geometry.axis, geometry.plane);
    return { source: "planner" as EyeAlignmentSource, outOfPlaneDeg: out ?? 0, plane: geometry.plane };
  }
  return { source: "set-to-pull" as EyeAlignmentSource, outOfPlaneDeg: 0 };
}

export interface EyeboltOptions {
  ruleSet?: RuleSetId;
  geometry?: EyeGeometry;
}

/** Eyebolt: leg load (kg) against the rule set's derated WLL for the angle (deg) between leg and bolt axis; thread must match. */
export function checkEyebolt(
  legId: string,
  designLoadKg: number,
  axisAngleDeg: number,
  spec: EyeboltSpec,
  liftPointThread: string | undefined,
  tables: ReferenceTables,
  options: EyeboltOptions = {},
): Check {
  const ruleSet = options.ruleSet ?? DEFAULT_RULE_SET;
  const rules = ruleSetRow(tables, ruleSet);
  const familyName =
    spec.family === "collar" ? "collar eyebolt" : spec.family === "shoulder" ? "shoulder eyebolt" : "plain eyebolt";
  const angle = axisAngleDeg;
  const alignment = eyeAlignment(spec, options.geometry, angle);
  const base: CheckBase = {
    id: `eyebolt-${legId}`,
    kind: "eyebolt",
    item: `Eyebolt at ${legId} (${spec.thread} ${familyName})`,
    itemCode: spec.itemCode ?? null,
    position: { legs: [legId] },
    rule: "Eyebolt WLL derated for the pull's angle to the bolt axis",
    ruleSet,
    source: rules.eyeboltSource,
    inputs: {
      axisAngleDeg: angle,
      family: spec.family,
      thread: spec.thread,
      liftPointThread: liftPointThread ?? null,
      eyeAlignment: alignment.source,
      outOfPlaneDeg: alignment.outOfPlaneDeg,
      ...("plane" in alignment ? { eyePlane: alignment.plane } : {}),
      ...markedWll(spec),
    },
  };
  const fail = (
    rule: string,
    finding: Parameters<typeof failCheck>[1],
    fix: Parameters<typeof failCheck>[2],
    capacityKg: number | null = null,
  ) => failCheck({ ...base, rule }, finding, fix, designLoadKg, capacityKg);
  if (liftPointThread !== undefined && normaliseThread(liftPointThread) !== normaliseThread(spec.thread)) {
    return fail("Eyebolt thread must match the tapped hole (common practice)", "thread-mismatch", {
      kind: "tapped-size",
      thread: liftPointThread,
    });
  }
  if (angle > 90 + TABLE_ANGLE_TOL_DEG) {
    return fail("No pull more than 90 deg from the bolt axis", "pull-behind", { kind: "lead-away-from-surface" });
  }
  const method = eyeboltMethod(rules, spec.family);
  const stated = statedWllKg(spec);
  let capacityKg: number;
  let rule: string;
  let source = rules.eyeboltSource;
  const extra: CheckBase["inputs"] = {};
  if (method === "in-line-only") {
    if (angle > IN_LINE_DEG + TABLE_ANGLE_TOL_DEG) {
      return fail("Plain eyebolts take in-line pull only (within 5 deg)", "plain-angled", {
        kind: "collar-or-shoulder-eyebolt",
      });
    }
    if (stated === null) return fail("Marked WLL required", "no-wll", { kind: "state-wll" });
    capacityKg = stated;
    rule = "Plain eyebolt, in-line pull (within 5 deg): marked WLL";
  } else {
    if (alignment.outOfPlaneDeg > IN_PLANE_TOL_DEG + TABLE_ANGLE_TOL_DEG && angle > IN_LINE_DEG + TABLE_ANGLE_TOL_DEG) {
      return fail("An angled pull must lie in the plane of the eye", "out-of-plane", { kind: "face-eye-to-pull" });
    }
    if (method === "din580") {
      const row = findDin580Eyebolt(tables.din580Eyebolts, spec.thread);
      if (row === null) {
        if (angle <= TABLE_ANGLE_TOL_DEG && stated !== null) {
          capacityKg = stated;
          rule = "Collar eyebolt, axial pull: marked WLL";
          source = "marked WLL";
        } else {
          return fail("DIN 580 table", "not-in-table", { kind: "tabulated-size" });
        }
      } else {
        const at = din580CapacityAtAngle(row, angle);
        if (at === null) return fail("DIN 580 table", "beyond-table", { kind: "lead-away-from-surface" });
        // A marked WLL different from the table scales the whole row (never above the marking).
        const scaleToMarked = stated !== null ? Math.min(1, stated / row.axialKg) : 1;
        capacityKg = at.capacityKg * scaleToMarked;
        extra.column = at.column;
        extra.wllKg = row.axialKg;
        extra.wllFrom = "table";
        if (scaleToMarked < 1) extra.scaleToMarked = scaleToMarked;
        rule =
          "DIN 580 column for the angle (next larger tabulated angle, never interpolated); per eyebolt, not added up for multi-leg lifts";
        source = row.source;
      }
    } else {
      // Percentage of the rated (axial) load: marked, or for a collar eyebolt the DIN 580 axial value.
      const din = spec.family === "collar" ? findDin580Eyebolt(tables.din580Eyebolts, spec.thread) : null;
      const ratedKg = stated ?? din?.axialKg ?? null;
      if (ratedKg === null) return fail("Marked WLL required", "no-wll", { kind: "state-wll" });
      const row = rowForAngle(tables.shoulderEyeboltAngles, angle);
      if (row === null) return fail("Shoulder eyebolt angle table", "beyond-table", { kind: "lead-away-from-surface" });
      capacityKg = (ratedKg * row.percent) / 100;
      extra.percent = row.percent;
      extra.tableUpToDeg = row.upToAngleDeg;
      extra.wllKg = ratedKg;
      extra.wllFrom = stated !== null ? "marked" : "table";
      rule = "Percentage of the rated load for the angle (next larger tabulated angle, never interpolated)";
      source = row.source;
    }
  }
  // What an eyebolt must be rated (axially) for to carry the load at this angle.
  const ratedKg = stated ?? extra.wllKg ?? capacityKg;
  const fraction = ratedKg > 0 ? capacityKg / ratedKg : 1;
  // Where the hole's thread is recorded it fixes the eyebolt's size: a larger eyebolt will not fit.
  const minWllKg = designLoadKg / Math.max(fraction, EPS);
  const result = ratioCheck(
    { ...base, rule, source, inputs: { ...base.inputs, ...extra } },
    designLoadKg,
    capacityKg,
    liftPointThread !== undefined
      ? { kind: "tapped-size-limit", thread: normaliseThread(liftPointThread), minWllKg }
      : { kind: "larger-item", minWllKg },
  );
  if (liftPointThread === undefined && result.verdict === "pass") {
    return { ...result, verdict: "warn", finding: "thread-unrecorded", fix: { kind: "confirm-thread" } };
  }
  return result;
}

export interface ShackleOptions {
  ruleSet?: RuleSetId;
  /** Side-load angle from the geometry, deg, and how it was found (ignored when the spec states one). */
  sideLoad?: { angleDeg: number; from: SideLoadSource };
}

/** Shackle at a lift point: leg load (kg) against WLL reduced for side load by the rule set's table. */
export function checkShackle(
  legId: string,
  designLoadKg: number,
  spec: ShackleSpec,
  tables: ReferenceTables,
  options: ShackleOptions = {},
): Check {
  const ruleSet = options.ruleSet ?? DEFAULT_RULE_SET;
  const given = spec.sideLoadAngleDeg;
  const side = given ?? options.sideLoad?.angleDeg ?? 0;
  const from: SideLoadSource = given !== undefined ? "given" : (options.sideLoad?.from ?? "lug-assumed");
  const row = findShackleSideLoad(tables.shackleSideLoad, side, ruleSet);
  const wllKg = statedWllKg(spec);
  const base: CheckBase = {
    id: `shackle-${legId}`,
    kind: "shackle",
    item: `Shackle at ${legId} (${spec.type}${spec.pin ? `, ${spec.pin} pin` : ""})`,
    itemCode: spec.itemCode ?? null,
    position: { legs: [legId] },
    rule: "Shackle WLL reduced for side load (next larger tabulated angle)",
    ruleSet,
    source: row?.source ?? "shackle side load table",
    inputs: {
      sideLoadAngleDeg: side,
      sideLoadFrom: from,
      ...(row ? { percent: row.percent, tableUpToDeg: row.upToAngleDeg } : {}),
      ...markedWll(spec),
    },
  };
  if (wllKg === null) return failCheck(base, "no-wll", { kind: "state-wll" }, designLoadKg, null);
  if (row === null) return failCheck(base, "beyond-table", { kind: "face-eye-to-pull" }, designLoadKg, null);
  return ratioCheck({ ...base, inputs: { ...base.inputs, wllKg } }, designLoadKg, (wllKg * row.percent) / 100, {
    kind: "larger-item",
    minWllKg: (designLoadKg * 100) / row.percent,
  });
}

/** Side-load angle of a shackle at a lift point: the pull's angle out of the eye's (or lug's) plane, deg. */
export function shackleSideLoad(
  pull: Vec3,
  axis: Vec3,
  plane: EyePlane | undefined,
  eyebolt: Pick<EyeboltSpec, "family" | "eyeAlignedWithPull"> | undefined,
  axisAngleDeg: number,
): { angleDeg: number; from: SideLoadSource } {
  if (eyebolt) {
    return { angleDeg: eyeAlignment(eyebolt, { pull, axis, plane }, axisAngleDeg).outOfPlaneDeg, from: "eye-plane" };
  }
  if (plane === "x" || plane === "y")
    return { angleDeg: angleOutOfPlaneDeg(pull, axis, plane) ?? 0, from: "lug-plane" };
  return { angleDeg: 0, from: "lug-assumed" };
}

/** Two legs on one shackle: resultant load (kg) against WLL; an included angle over the rule set's limit fails. */
export function checkSharedShackle(
  index: number,
  legA: LegResult,
  legB: LegResult,
  loadFactor: number,
  spec: SharedShackleSpec,
  options: { ruleSet?: RuleSetId; maxIncludedDeg?: number } = {},
): Check {
  const a: Vec3 = legA.direction;
  const b: Vec3 = legB.direction;
  const included = deg(Math.atan2(norm(cross(a, b)), dot(a, b)));
  const ta = legA.tensionKg * loadFactor;
  const tb = legB.tensionKg * loadFactor;
  const resultantKg = norm({ x: ta * a.x + tb * b.x, y: ta * a.y + tb * b.y, z: ta * a.z + tb * b.z });
  const wllKg = statedWllKg(spec);
  const maxIncludedDeg = options.maxIncludedDeg ?? MAX_SHACKLE_INCLUDED_DEG;
  const base: CheckBase = {
    id: `shared-shackle-${index + 1}`,
    kind: "shared-shackle",
    item: `Shackle joining legs ${legA.liftPointId} and ${legB.liftPointId}`,
    itemCode: spec.itemCode ?? null,
    position: { legs: [legA.liftPointId, legB.liftPointId] },
    rule: "Resultant of both legs against the WLL; included angle within the limit",
    ruleSet: options.ruleSet ?? DEFAULT_RULE_SET,
    source: `Two legs on one shackle: included angle at most ${maxIncludedDeg} deg (common practice across rigging hardware guidance)`,
    inputs: { includedAngleDeg: included, maxIncludedDeg, ...markedWll(spec), ...(wllKg !== null ? { wllKg } : {}) },
  };
  if (included > maxIncludedDeg + TABLE_ANGLE_TOL_DEG) {
    return failCheck(base, "included-angle", { kind: "shackle-per-leg" }, resultantKg, wllKg);
  }
  if (wllKg === null) return failCheck(base, "no-wll", { kind: "state-wll" }, resultantKg, null);
  return ratioCheck(base, resultantKg, wllKg, { kind: "larger-item", minWllKg: resultantKg });
}
