// Spreader and lifting beams: vertical drops from the beam to the load's lift points; the beam
// itself hangs from one top lug (lifting beam) or a 2-leg bridle to two top lugs (spreader).
import {
  solveLevel,
  GEOMETRY_TOL_M,
  type BridleRating,
  type BridleSolution,
  type LiftPoint,
  type SolveWarning,
} from "./bridle";
import {
  diagonalTwoLegTensions,
  emptySlackStates,
  rateLegs,
  recordSlackState,
  type SlackStates,
} from "./bridle-rating";
import { Z_UP } from "./bridle-types";
import { STANDARD_GRAVITY_MS2 } from "./units";
import { det3, solve3, type Mat3, type Vec3 } from "./vector";

export interface DropResult {
  liftPointId: string;
  tensionKn: number;
  tensionKg: number;
  /** Fraction of the load's weight this drop carries, 0..1. */
  share: number;
  slack: boolean;
}

export interface BeamDropsSolution {
  method: "determinate" | "elastic";
  drops: DropResult[];
  warnings: SolveWarning[];
  /**
   * How the drops are rated, in the bridle rating's shape: `rating.legs[i]` is drop i's design
   * tension (lever rule for 2 drops; for 3 or more at least every admissible state with a drop
   * slack, and the diagonal figure for 4, unless symmetric), with the rule that governed.
   */
  rating: BridleRating;
}

export interface BeamSpec {
  massKg: number;
  /** The beam's own CoG in the component frame, m. */
  cog: Vec3;
  /** One lug (lifting beam) or two lugs (spreader on a 2-leg bridle), component frame, m. */
  topLugs: Vec3[];
}

export interface BeamLiftSolution {
  drops: BeamDropsSolution;
  /** Load plus beam, kg: what the hook and top rigging carry. */
  hookMassKg: number;
  combinedCog: Vec3;
  top: BridleSolution;
  warnings: SolveWarning[];
}

/**
 * Most a beam on one top lug may hang out of level and still be planned as level, deg (common practice:
 * a beam is set level by eye within about a degree; beyond that choose a lug above the CoG).
 */
export const BEAM_TILT_LIMIT_DEG = 1;

export type BeamOutcome<T> = { ok: true; solution: T } | { ok: false; code: string; message: string };

/**
 * Loads in vertical drops (equal stiffness unless dropLengthsM given, m) to the load's lift points:
 * lever rule for 2 drops, elastic share of a rigid load for 3 or more.
 */
export function solveBeamDrops(
  massKg: number,
  cog: Vec3,
  points: readonly LiftPoint[],
  dropLengthsM?: readonly number[],
): BeamOutcome<BeamDropsSolution> {
  const n = points.length;
  if (n < 1) return { ok: false, code: "DEGENERATE_LIFT_POINTS", message: "Give at least one drop." };
  const weightN = massKg * STANDARD_GRAVITY_MS2;
  const k = points.map((_, i) => {
    const len = dropLengthsM?.[i];
    return len !== undefined && len > 0 ? 1 / len : 1;
  });
  const rel = points.map((p) => ({ x: p.position.x - cog.x, y: p.position.y - cog.y }));
  const active = points.map((_, i) => i);
  const warnings: SolveWarning[] = [];
  let tensions: number[] | null = null;
  let method: "determinate" | "elastic" = n <= 2 ? "determinate" : "elastic";
  for (;;) {
    const res = dropTensions(rel, k, active, weightN);
    if (res.kind === "fail") return { ok: false, code: res.code, message: res.message(points) };
    if (res.kind === "ok") {
      tensions = res.tensions;
      break;
    }
    // A drop would have to push: it goes slack, the others carry.
    active.splice(active.indexOf(res.index), 1);
    method = active.length <= 2 ? "determinate" : "elastic";
    warnings.push({
      code: "DROP_SLACK",
      message: `The drop to lift point ${points[res.index]!.id} goes slack; the other drops carry the load.`,
    });
  }
  const minZ = Math.min(...points.map((p) => p.position.z));
  if (!(cog.z < minZ - GEOMETRY_TOL_M)) {
    warnings.push({
      code: "BEAM_LOAD_UNSTABLE",
      message:
        "The load's CoG is not below its lift points: on vertical drops it can topple; lift from points above the CoG or steady the load.",
    });
  }
  const drops = points.map((p, i) => {
    const t = tensions![i] ?? 0;
    return {
      liftPointId: p.id,
      tensionKn: t / 1000,
      tensionKg: t / STANDARD_GRAVITY_MS2,
      share: weightN > 0 ? t / weightN : 0,
      slack: !active.includes(i),
    };
  });
  const weightKn = weightN / 1000;
  const rating = rateLegs({
    legs: drops.map((d) => ({ liftPointId: d.liftPointId, tensionKn: d.tensionKn, angleFromVerticalDeg: 0 })),
    weightKn,
    method,
    diagonal:
      n === 4
        ? diagonalTwoLegTensions(
            [0, 0, 0, 0],
            points.map((p) => p.position),
            cog,
            Z_UP,
            weightKn,
          )
        : null,
    slack: n >= 3 ? dropSlackStates(rel, k, weightN) : null,
    noun: "drop",
  });
  return { ok: true, solution: { method, drops, warnings, rating } };
}

/**
 * Drops with some slack: every set of 2 or 3 drops (leaving at least one slack) that can carry the
 * load with no drop pushing. The admissible states of the drops form a polytope whose corners have at
 * most 3 drops carrying, so these maxima (kN) bound every drop's load over all admissible states.
 */
function dropSlackStates(rel: readonly { x: number; y: number }[], k: readonly number[], weightN: number): SlackStates {
  const n = rel.length;
  const states = emptySlackStates(n);
  const record = (subset: number[]): void => {
    const res = dropTensions(rel, k, subset, weightN);
    if (res.kind === "ok")
      recordSlackState(
        states,
        res.tensions.map((t) => t / 1000),
        subset,
        n,
      );
  };
  // Three carrying first, so a state with one drop slack names the figure when a pair ties with it.
  for (let i = 0; i < n && n > 3; i++) {
    for (let j = i + 1; j < n; j++) for (let m = j + 1; m < n; m++) record([i, j, m]);
  }
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) record([i, j]);
  return states;
}

type DropStep =
  | { kind: "ok"; tensions: number[] }
  | { kind: "negative"; index: number }
  | { kind: "fail"; code: string; message: (points: readonly LiftPoint[]) => string };

function dropTensions(
  rel: readonly { x: number; y: number }[],
  k: readonly number[],
  active: readonly number[],
  weightN: number,
): DropStep {
  const tensions = new Array<number>(rel.length).fill(0);
  const offPlumb: DropStep = {
    kind: "fail",
    code: "COG_OUTSIDE_SUPPORT",
    message: (pts) =>
      `The CoG's plumb point is not within the drops to ${active.map((i) => pts[i]!.id).join(", ")}; place the drops around the CoG.`,
  };
  if (active.length === 1) {
    const i = active[0]!;
    const r = rel[i]!;
    if (Math.hypot(r.x, r.y) > GEOMETRY_TOL_M) return offPlumb;
    tensions[i] = weightN;
    return { kind: "ok", tensions };
  }
  let sk = 0,
    skx = 0,
    sky = 0,
    skxx = 0,
    skxy = 0,
    skyy = 0;
  for (const i of active) {
    const r = rel[i]!;
    const ki = k[i]!;
    sk += ki;
    skx += ki * r.x;
    sky += ki * r.y;
    skxx += ki * r.x * r.x;
    skxy += ki * r.x * r.y;
    skyy += ki * r.y * r.y;
  }
  const m: Mat3 = [sk, skx, sky, skx, skxx, skxy, sky, skxy, skyy];
  const scale = sk * (skxx + skyy) * (skxx + skyy) + 1e-300;
  let coeff: { a: number; b: number; c: number };
  if (active.length >= 3 && Math.abs(det3(m)) / scale > 1e-12) {
    const s = solve3(m, { x: weightN, y: 0, z: 0 });
    if (s === null) return offPlumb;
    coeff = { a: s.x, b: s.y, c: s.z };
  } else {
    // Drops in one line in plan: the CoG must lie on that line; lever rule along it.
    const first = rel[active[0]!]!;
    let far = first;
    let farD = 0;
    for (const i of active) {
      const d = Math.hypot(rel[i]!.x - first.x, rel[i]!.y - first.y);
      if (d > farD) {
        farD = d;
        far = rel[i]!;
      }
    }
    if (!(farD > GEOMETRY_TOL_M)) {
      return {
        kind: "fail",
        code: "DEGENERATE_LIFT_POINTS",
        message: () => "The drops are all at one point in plan; spread them.",
      };
    }
    const ex = (far.x - first.x) / farD;
    const ey = (far.y - first.y) / farD;
    // Distance of the CoG (origin) from the line.
    if (Math.abs(ex * -first.y - ey * -first.x) > GEOMETRY_TOL_M) return offPlumb;
    let s1 = 0,
      s2 = 0;
    for (const i of active) {
      const s = rel[i]!.x * ex + rel[i]!.y * ey;
      s1 += k[i]! * s;
      s2 += k[i]! * s * s;
    }
    const det = sk * s2 - s1 * s1;
    const a = (weightN * s2) / det;
    const b = (-weightN * s1) / det;
    coeff = { a, b: b * ex, c: b * ey };
  }
  let worst = -1;
  let worstT = -1e-9 * weightN;
  for (const i of active) {
    const r = rel[i]!;
    const t = k[i]! * (coeff.a + coeff.b * r.x + coeff.c * r.y);
    tensions[i] = t;
    if (t < worstT) {
      worstT = t;
      worst = i;
    }
  }
  if (worst >= 0) {
    if (active.length <= 2) return offPlumb;
    return { kind: "negative", index: worst };
  }
  for (const i of active) tensions[i] = Math.max(0, tensions[i]!);
  return { kind: "ok", tensions };
}

/**
 * Load on vertical drops from a beam, and the beam (plus load) hung from its top lug(s) at hookZM (m).
 * The beam's mass joins the hook load.
 */
export function solveBeamLift(
  massKg: number,
  cog: Vec3,
  points: readonly LiftPoint[],
  beam: BeamSpec,
  hookZM: number,
  dropLengthsM?: readonly number[],
): BeamOutcome<BeamLiftSolution> {
  const drops = solveBeamDrops(massKg, cog, points, dropLengthsM);
  if (!drops.ok) return drops;
  const hookMassKg = massKg + beam.massKg;
  const combinedCog: Vec3 = {
    x: (massKg * cog.x + beam.massKg * beam.cog.x) / hookMassKg,
    y: (massKg * cog.y + beam.massKg * beam.cog.y) / hookMassKg,
    z: (massKg * cog.z + beam.massKg * beam.cog.z) / hookMassKg,
  };
  const warnings: SolveWarning[] = [];
  let topLugs = beam.topLugs;
  if (topLugs.length === 1) {
    // One top lug: the beam and load swing about it until their CoG hangs below it.
    const lug = topLugs[0]!;
    const off = Math.hypot(lug.x - combinedCog.x, lug.y - combinedCog.y);
    const tiltDeg = (Math.atan2(off, Math.max(lug.z - combinedCog.z, 0)) * 180) / Math.PI;
    if (tiltDeg > BEAM_TILT_LIMIT_DEG) {
      return {
        ok: false,
        code: "BEAM_NOT_BALANCED",
        message: `The beam's top lug is ${Math.round(off * 1000)} mm from above the CoG of beam and load, so they would hang about ${tiltDeg.toFixed(1)}° out of level: use a beam whose top lug sits above the CoG, or one with an adjustable lug.`,
      };
    }
    if (off > 0.001)
      warnings.push({
        code: "BEAM_TILTS",
        message: `The beam's top lug is ${Math.round(off * 1000)} mm from above the CoG of beam and load: the beam hangs about ${tiltDeg.toFixed(1)}° out of level.`,
      });
    topLugs = [{ x: combinedCog.x, y: combinedCog.y, z: lug.z }];
  }
  const lugs: LiftPoint[] = topLugs.map((p, i) => ({
    id: `lug ${i + 1}`,
    position: p,
    axis: { x: 0, y: 0, z: 1 },
  }));
  const top = solveLevel({ massKg: hookMassKg, cog: combinedCog }, lugs, hookZM);
  if (!top.ok) {
    return { ok: false, code: top.code, message: `The beam with its load cannot hang level: ${top.message}` };
  }
  return {
    ok: true,
    solution: {
      drops: drops.solution,
      hookMassKg,
      combinedCog,
      top: top.solution,
      warnings: [...drops.solution.warnings, ...warnings, ...top.solution.warnings],
    },
  };
}
