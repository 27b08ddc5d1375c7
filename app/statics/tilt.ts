// How the load hangs against how level it must be: the tilt in each of the component's own planes,
// the leg lengths that would hang it level, and the check of the tilt against the component's fit
// tolerance (the largest tilt at which it can still be guided onto its spigot or dowels). Pure.
import { solveLevel, type BridleLoad, type BridleSolution, type LiftPoint } from "./bridle";
import type { Check, Fix } from "./check-types";
import { EPS } from "./checks-common";
import { DEFAULT_RULE_SET, type RuleSetId } from "./reference";

/**
 * Fit tolerance used when the component records none, deg. Common practice: a part guided onto
 * dowels or a spigot with an ordinary lead-in is set down within about a degree of level.
 */
export const DEFAULT_FIT_TOLERANCE_DEG = 1;
export const DEFAULT_FIT_TOLERANCE_SOURCE = "common practice";

const RAD_TO_DEG = 180 / Math.PI;

/** The tilt of the load in each of its own planes, deg (0 = level; sign: positive when that end is raised). */
export interface PlaneTilts {
  /** In the component's x-z plane: level along its length (x); positive when the +x end is higher. */
  alongLengthDeg: number;
  /** In the component's y-z plane: level across its width (y); positive when the +y side is higher. */
  acrossWidthDeg: number;
}

/**
 * Tilt in each of the component's planes from the true vertical (up, unit, component frame): the
 * angle, within that plane, between the component's z axis and the vertical projected into it.
 */
export function planeTilts(vertical: { x: number; y: number; z: number }): PlaneTilts {
  return {
    alongLengthDeg: Math.atan2(vertical.x, vertical.z) * RAD_TO_DEG,
    acrossWidthDeg: Math.atan2(vertical.y, vertical.z) * RAD_TO_DEG,
  };
}

/** Per leg: the length that hangs the load level, and the change from the given length (negative: shorten), m. */
export interface LegLevelling {
  liftPointId: string;
  givenLengthM: number;
  levelLengthM: number;
  changeM: number;
}

export type Levelling = { ok: true; hookZM: number; legs: LegLevelling[] } | { ok: false; reason: string };

/**
 * The leg lengths that would hang the load level, against the given ones (m). The hook is put plumb over
 * the CoG at the highest height every leg still reaches, so one leg keeps its length and the others only
 * shorten (the change a rigger can make with shorteners); a leg that cannot reach the plumb line at all
 * is lengthened. Refused (ok: false) when no level hang exists for these lift points.
 */
export function levellingLengths(
  load: BridleLoad,
  points: readonly LiftPoint[],
  givenLengthsM: readonly number[],
): Levelling {
  const g = load.cog;
  let hookZM = Infinity;
  points.forEach((p, i) => {
    const length = givenLengthsM[i] ?? 0;
    const r = Math.hypot(p.position.x - g.x, p.position.y - g.y);
    if (length > r) hookZM = Math.min(hookZM, p.position.z + Math.sqrt(length * length - r * r));
  });
  if (!Number.isFinite(hookZM)) return { ok: false, reason: "No leg reaches above the CoG." };
  const level = solveLevel(load, points, hookZM);
  if (!level.ok) return { ok: false, reason: level.message };
  return {
    ok: true,
    hookZM,
    legs: points.map((p, i) => {
      const levelLengthM = level.solution.legs[i]!.lengthM;
      const givenLengthM = givenLengthsM[i] ?? 0;
      return { liftPointId: p.id, givenLengthM, levelLengthM, changeM: levelLengthM - givenLengthM };
    }),
  };
}

/** A component's fit tolerance as the plan records it: null when none is known. */
export interface FitTolerance {
  toleranceDeg: number | null;
  source?: string;
}

/** Leg changes shorter than this (m) are left out of the fix: below what a rigger can set. */
export const SMALLEST_LEG_CHANGE_M = 0.0005;

/**
 * The load's tilt in each of its planes (deg) against its fit tolerance (deg). Utilisation is the larger
 * plane tilt over the tolerance, unrounded; over 1 fails, with the leg changes that would level it.
 */
export function checkFitTilt(
  solution: BridleSolution,
  fit: FitTolerance,
  levelling: Levelling | null,
  ruleSet: RuleSetId = DEFAULT_RULE_SET,
): Check {
  const tilts = planeTilts(solution.vertical);
  const known = fit.toleranceDeg !== null && fit.toleranceDeg > 0;
  const toleranceDeg = known ? fit.toleranceDeg! : DEFAULT_FIT_TOLERANCE_DEG;
  const source = known ? fit.source?.trim() || "as recorded on the component" : DEFAULT_FIT_TOLERANCE_SOURCE;
  const worstDeg = Math.max(Math.abs(tilts.alongLengthDeg), Math.abs(tilts.acrossWidthDeg));
  const utilisation = worstDeg / toleranceDeg;
  const over = utilisation > 1 + EPS;
  let fix: Fix | null = null;
  if (over && levelling?.ok) {
    const legs = levelling.legs
      .filter((l) => Math.abs(l.changeM) >= SMALLEST_LEG_CHANGE_M)
      .map((l) => ({ legId: l.liftPointId, changeM: l.changeM }));
    if (legs.length > 0) fix = { kind: "level-legs", legs };
  }
  return {
    id: "fit-tilt",
    kind: "load-tilt",
    item: "Load tilt for fitting",
    itemCode: null,
    position: { legs: [] },
    verdict: over ? "fail" : "pass",
    finding: over ? "tilt-over" : "tilt-ok",
    loadKg: null,
    capacityKg: null,
    utilisation,
    rule: "Tilt in each of the component's planes (along its length, across its width) within its fit tolerance",
    ruleSet,
    source: known ? `Fit tolerance: ${source}` : `Fit tolerance not recorded for the component: ${source}`,
    inputs: {
      mode: solution.mode,
      tilt: {
        alongLengthDeg: tilts.alongLengthDeg,
        acrossWidthDeg: tilts.acrossWidthDeg,
        toleranceDeg,
        toleranceFrom: known ? "component" : "common-practice",
      },
    },
    fix,
  };
}
