// Bridle statics: legs from one hook point H to the lift points of a rigid load.
// Level mode puts H plumb over G at a given height; given-lengths mode finds where the load
// settles on slings of known length. Closed-form 3x3 math throughout (no allocation-heavy libs).
import { STANDARD_GRAVITY_MS2 } from "./units";
import {
  angleBetweenDeg,
  columns3,
  cross,
  det3,
  distance,
  dot,
  normalize,
  solve3,
  sub,
  type Mat3,
  type Vec3,
} from "./vector";

export interface LiftPoint {
  id: string;
  /** Point where the leg's line of force acts, component frame, m. */
  position: Vec3;
  /** Unit vector of the tapped hole's axis out of the surface (default +z). */
  axis: Vec3;
}

export interface BridleLoad {
  massKg: number;
  /** Centre of gravity in the component frame, m. */
  cog: Vec3;
}

export type SolveMode = "level" | "lengths";
export type SolveMethod = "determinate" | "elastic";

export interface SolveWarning {
  code: string;
  message: string;
}

export interface LegResult {
  liftPointId: string;
  lengthM: number;
  tensionKn: number;
  tensionKg: number;
  angleFromVerticalDeg: number;
  axisAngleDeg: number;
  verticalShare: number;
  slack: boolean;
  /** Unit vector from the lift point toward the hook, component frame. */
  direction: Vec3;
}

export interface LegDesignTension {
  liftPointId: string;
  designTensionKn: number;
  designTensionKg: number;
}

/** How the sling is rated: how many legs are taken to carry, by which rule. */
export interface BridleRating {
  legCount: number;
  symmetric: boolean;
  effectiveLegs: 1 | 2 | 3;
  maxAngleFromVerticalDeg: number;
  rule: string;
  source: string;
  /** Per-leg tension to rate each leg for: the statics tension, or more where the rule asks. */
  legs: LegDesignTension[];
  designTensionKn: number;
  designTensionKg: number;
}

export interface BridleSolution {
  mode: SolveMode;
  weightKn: number;
  method: SolveMethod;
  /** Hook point H in the component frame, m. */
  hook: Vec3;
  /** True vertical (up) at equilibrium, in the component frame. */
  vertical: Vec3;
  tiltDeg: number;
  legs: LegResult[];
  warnings: SolveWarning[];
  rating: BridleRating;
}

export type SolveErrorCode =
  | "ZERO_LENGTH_LEG"
  | "HOOK_NOT_ABOVE_COG"
  | "HOOK_NOT_ABOVE_LIFT_POINT"
  | "NOT_ON_PLUMB_LINE"
  | "COG_ABOVE_LIFT_POINT"
  | "COG_ABOVE_LIFT_LINE"
  | "COG_OFF_LEG_PLANE"
  | "COG_OUTSIDE_SUPPORT"
  | "DEGENERATE_LIFT_POINTS"
  | "LEGS_CANNOT_MEET"
  | "LEGS_NEARLY_STRAIGHT"
  | "NO_EQUILIBRIUM";

export type SolveOutcome =
  | { ok: true; solution: BridleSolution }
  | { ok: false; code: SolveErrorCode; message: string };

/** Geometric tolerance in metres: positions closer than this count as the same. */
export const GEOMETRY_TOL_M = 1e-6;
/** A given-lengths leg within this of its length counts as taut, m. */
export const TAUT_TOL_M = 1e-6;
/** A candidate hook point may exceed a leg length by this much and still be feasible, m. */
const FEASIBLE_TOL_M = 1e-9;
/** |det| of the three leg unit vectors below this: the legs lie in one plane. */
const MIN_DIRECTION_DET = 1e-9;
/** |det| below this still solves but warns that the answer is sensitive. */
const ILL_CONDITIONED_DET = 1e-3;
/** Tension below -this x W counts as genuinely negative (not rounding). */
const NEGATIVE_TENSION_TOL = 1e-9;
/** Legs count as symmetric when their angles agree within this and tensions within SYM_TENSION. */
export const SYMMETRY_ANGLE_TOL_DEG = 2;
export const SYMMETRY_TENSION_TOL = 0.05;
/** Tilt above this (deg) in given-lengths mode is reported as a warning. */
const TILT_WARN_DEG = 0.05;

const Z_UP: Vec3 = { x: 0, y: 0, z: 1 };
const RAD_TO_DEG = 180 / Math.PI;

function fail(code: SolveErrorCode, message: string): SolveOutcome {
  return { ok: false, code, message };
}

function mm(lengthM: number): string {
  return `${Math.round(lengthM * 1000)} mm`;
}

function names(points: readonly LiftPoint[], idx: readonly number[]): string {
  return idx.map((i) => points[i]?.id ?? "?").join(", ");
}

type TensionResult =
  | { ok: true; tensionsN: number[]; method: SolveMethod; conditioning: number }
  | { ok: false; kind: "degenerate" | "negative" | "residual"; index?: number };

/**
 * Tensions (N) of the active legs balancing weightN along `vertical`.
 * us: unit leg vectors (P -> H); lengths for the elastic stiffness 1/L.
 */
function activeTensions(
  us: readonly Vec3[],
  lengthsM: readonly number[],
  active: readonly number[],
  vertical: Vec3,
  weightN: number,
): TensionResult {
  const n = active.length;
  const tensions = new Array<number>(us.length).fill(0);
  if (n === 1) {
    const i = active[0]!;
    const u = us[i]!;
    const c = dot(u, vertical);
    // One leg must hang along the vertical.
    if (!(c > 0) || distance(u, vertical) > 1e-6) return { ok: false, kind: "residual", index: i };
    tensions[i] = weightN / c;
    return { ok: true, tensionsN: tensions, method: "determinate", conditioning: 1 };
  }
  if (n >= 2 && active.every((i) => distance(us[i]!, vertical) <= 1e-6)) {
    // Legs all along the vertical (e.g. from one point): share by stiffness 1/L.
    let kSum = 0;
    for (const i of active) kSum += 1 / lengthsM[i]!;
    for (const i of active) tensions[i] = weightN / lengthsM[i]! / kSum / dot(us[i]!, vertical);
    return { ok: true, tensionsN: tensions, method: "elastic", conditioning: 0 };
  }
  if (n === 2) {
    const i = active[0]!;
    const j = active[1]!;
    const ui = us[i]!;
    const uj = us[j]!;
    const c = dot(ui, uj);
    const det = 1 - c * c;
    if (!(det > MIN_DIRECTION_DET)) return { ok: false, kind: "degenerate" };
    const bi = weightN * dot(ui, vertical);
    const bj = weightN * dot(uj, vertical);
    const ti = (bi - c * bj) / det;
    const tj = (bj - c * bi) / det;
    const rx = ti * ui.x + tj * uj.x - weightN * vertical.x;
    const ry = ti * ui.y + tj * uj.y - weightN * vertical.y;
    const rz = ti * ui.z + tj * uj.z - weightN * vertical.z;
    if (Math.sqrt(rx * rx + ry * ry + rz * rz) > 1e-7 * weightN) return { ok: false, kind: "residual" };
    if (ti < -NEGATIVE_TENSION_TOL * weightN) return { ok: false, kind: "negative", index: i };
    if (tj < -NEGATIVE_TENSION_TOL * weightN) return { ok: false, kind: "negative", index: j };
    tensions[i] = Math.max(0, ti);
    tensions[j] = Math.max(0, tj);
    return { ok: true, tensionsN: tensions, method: "determinate", conditioning: det };
  }
  if (n === 3) {
    const i = active[0]!;
    const j = active[1]!;
    const k = active[2]!;
    const m = columns3(us[i]!, us[j]!, us[k]!);
    const det = Math.abs(det3(m));
    if (!(det > MIN_DIRECTION_DET)) return { ok: false, kind: "degenerate" };
    const t = solve3(m, { x: weightN * vertical.x, y: weightN * vertical.y, z: weightN * vertical.z });
    if (t === null) return { ok: false, kind: "degenerate" };
    const tol = -NEGATIVE_TENSION_TOL * weightN;
    const worst = t.x <= t.y && t.x <= t.z ? i : t.y <= t.z ? j : k;
    if (t.x < tol || t.y < tol || t.z < tol) return { ok: false, kind: "negative", index: worst };
    tensions[i] = Math.max(0, t.x);
    tensions[j] = Math.max(0, t.y);
    tensions[k] = Math.max(0, t.z);
    return { ok: true, tensionsN: tensions, method: "determinate", conditioning: det };
  }
  // Four (or more) legs: elastic share for equal EA, stiffness k = 1/L.
  const K: Mat3 = [0, 0, 0, 0, 0, 0, 0, 0, 0];
  for (const i of active) {
    const u = us[i]!;
    const k = 1 / lengthsM[i]!;
    K[0] += k * u.x * u.x;
    K[1] += k * u.x * u.y;
    K[2] += k * u.x * u.z;
    K[4] += k * u.y * u.y;
    K[5] += k * u.y * u.z;
    K[8] += k * u.z * u.z;
  }
  K[3] = K[1];
  K[6] = K[2];
  K[7] = K[5];
  const trace3 = (K[0] + K[4] + K[8]) / 3;
  const conditioning = Math.abs(det3(K)) / (trace3 * trace3 * trace3);
  if (!(conditioning > MIN_DIRECTION_DET)) return { ok: false, kind: "degenerate" };
  const d = solve3(K, { x: weightN * vertical.x, y: weightN * vertical.y, z: weightN * vertical.z });
  if (d === null) return { ok: false, kind: "degenerate" };
  let worst = -1;
  let worstT = -NEGATIVE_TENSION_TOL * weightN;
  for (const i of active) {
    const t = dot(us[i]!, d) / lengthsM[i]!;
    tensions[i] = t;
    if (t < worstT) {
      worstT = t;
      worst = i;
    }
  }
  if (worst >= 0) return { ok: false, kind: "negative", index: worst };
  for (const i of active) tensions[i] = Math.max(0, tensions[i]!);
  return { ok: true, tensionsN: tensions, method: "elastic", conditioning };
}

/** Perpendicular unit vector to v, chosen deterministically. */
function perpendicular(v: Vec3): Vec3 {
  const seed = Math.abs(v.x) < 0.9 ? { x: 1, y: 0, z: 0 } : { x: 0, y: 1, z: 0 };
  const p = sub(seed, { x: v.x * dot(seed, v), y: v.y * dot(seed, v), z: v.z * dot(seed, v) });
  return normalize(p) ?? { x: 0, y: 0, z: 1 };
}

function buildLegs(
  points: readonly LiftPoint[],
  lengthsM: readonly number[],
  us: readonly Vec3[],
  tensionsN: readonly number[],
  slack: readonly boolean[],
  vertical: Vec3,
  weightN: number,
): LegResult[] {
  const legs: LegResult[] = [];
  for (let i = 0; i < points.length; i++) {
    const p = points[i]!;
    const u = us[i]!;
    const t = tensionsN[i] ?? 0;
    legs.push({
      liftPointId: p.id,
      lengthM: lengthsM[i]!,
      tensionKn: t / 1000,
      tensionKg: t / STANDARD_GRAVITY_MS2,
      angleFromVerticalDeg: angleBetweenDeg(u, vertical),
      axisAngleDeg: angleBetweenDeg(u, p.axis),
      verticalShare: weightN > 0 ? (t * dot(u, vertical)) / weightN : 0,
      slack: slack[i] ?? false,
      direction: u,
    });
  }
  return legs;
}

/** Rates the solved bridle by the multi-leg rules: symmetric uniform load, else fewer legs carry. */
export function rateBridle(
  legs: readonly LegResult[],
  liftPointPositions: readonly Vec3[],
  cog: Vec3,
  vertical: Vec3,
  weightKn: number,
): BridleRating {
  const n = legs.length;
  let maxBeta = 0;
  let minBeta = Infinity;
  let maxT = 0;
  let minT = Infinity;
  for (const leg of legs) {
    maxBeta = Math.max(maxBeta, leg.angleFromVerticalDeg);
    minBeta = Math.min(minBeta, leg.angleFromVerticalDeg);
    maxT = Math.max(maxT, leg.tensionKn);
    minT = Math.min(minT, leg.tensionKn);
  }
  const symmetric =
    n <= 1 ||
    (maxBeta - minBeta <= SYMMETRY_ANGLE_TOL_DEG && maxT > 0 && (maxT - minT) / maxT <= SYMMETRY_TENSION_TOL);
  const design = legs.map((leg) => leg.tensionKn);
  let effectiveLegs: 1 | 2 | 3;
  let rule: string;
  if (n === 1) {
    effectiveLegs = 1;
    rule = "Single leg: the leg carries the whole load.";
  } else if (n === 2) {
    effectiveLegs = symmetric ? 2 : 1;
    rule = symmetric
      ? "2-leg sling, symmetric: both legs carry (uniform load method, 2-leg mode factor)."
      : "2-leg sling, not symmetric: rated as if 1 leg carries (DGUV Regel 100-500); leg loads from statics.";
  } else if (n === 3) {
    effectiveLegs = symmetric ? 3 : 2;
    rule = symmetric
      ? "3-leg sling, symmetric: all 3 legs carry (uniform load method, 3/4-leg mode factor)."
      : "3-leg sling, not symmetric: rated as if only 2 legs carry (NAVEDTRA; DGUV Regel 100-500); leg loads from statics.";
  } else if (symmetric) {
    effectiveLegs = 3;
    rule =
      "4-leg sling, symmetric: rated as if 3 legs carry (DGUV Regel 100-500; 3/4-leg mode factor); each leg rated for W / (3 cos beta) or its elastic share if larger.";
    for (let i = 0; i < n; i++) {
      const leg = legs[i]!;
      const c = Math.max(1e-6, Math.cos(leg.angleFromVerticalDeg / RAD_TO_DEG));
      design[i] = Math.max(design[i]!, weightKn / (3 * c));
    }
  } else {
    effectiveLegs = 2;
    rule =
      "4-leg sling, not symmetric: rated as if only the 2 legs of a diagonal carry (NAVEDTRA; DGUV Regel 100-500); each leg rated for its lever-rule share of the load on its diagonal, or its elastic share if larger.";
    const twoLeg = diagonalTwoLegTensions(legs, liftPointPositions, cog, vertical, weightKn);
    for (let i = 0; i < n; i++) design[i] = Math.max(design[i]!, twoLeg[i] ?? 0);
  }
  let maxDesign = 0;
  const legsOut: LegDesignTension[] = legs.map((leg, i) => {
    const kn = design[i]!;
    maxDesign = Math.max(maxDesign, kn);
    return { liftPointId: leg.liftPointId, designTensionKn: kn, designTensionKg: (kn * 1000) / STANDARD_GRAVITY_MS2 };
  });
  return {
    legCount: n,
    symmetric,
    effectiveLegs,
    maxAngleFromVerticalDeg: maxBeta,
    rule,
    source: "DGUV Regel 100-500; US Navy NAVEDTRA rigging manuals; EN 818-4 / EN 13414-1 mode factors",
    legs: legsOut,
    designTensionKn: maxDesign,
    designTensionKg: (maxDesign * 1000) / STANDARD_GRAVITY_MS2,
  };
}

/**
 * For 4 legs: tension (kN) each leg takes if it and its diagonal partner carry the whole
 * weight, shared by the lever rule on the plan projection, at the leg's own angle.
 */
function diagonalTwoLegTensions(
  legs: readonly LegResult[],
  positions: readonly Vec3[],
  cog: Vec3,
  vertical: Vec3,
  weightKn: number,
): number[] {
  const e1 = perpendicular(vertical);
  const e2 = cross(vertical, e1);
  const plan = positions.map((p) => {
    const r = sub(p, cog);
    return { a: dot(r, e1), b: dot(r, e2) };
  });
  const order = plan.map((_, i) => i).sort((i, j) => Math.atan2(plan[i]!.b, plan[i]!.a) - Math.atan2(plan[j]!.b, plan[j]!.a));
  const out = new Array<number>(legs.length).fill(0);
  const pairs: Array<[number, number]> = [
    [order[0]!, order[2]!],
    [order[1]!, order[3]!],
  ];
  for (const [i, j] of pairs) {
    const qi = plan[i]!;
    const qj = plan[j]!;
    const da = qj.a - qi.a;
    const db = qj.b - qi.b;
    const len2 = da * da + db * db;
    // Projection of the CoG's plumb point (the origin) onto the diagonal, clamped to it.
    let s = len2 > 1e-18 ? -(qi.a * da + qi.b * db) / len2 : 0.5;
    s = Math.min(1, Math.max(0, s));
    const shares: Array<[number, number]> = [
      [i, 1 - s],
      [j, s],
    ];
    for (const [idx, share] of shares) {
      const beta = legs[idx]!.angleFromVerticalDeg / RAD_TO_DEG;
      const c = Math.max(1e-6, Math.cos(beta));
      out[idx] = (share * weightKn) / c;
    }
  }
  return out;
}

function finish(
  mode: SolveMode,
  load: BridleLoad,
  points: readonly LiftPoint[],
  lengthsM: readonly number[],
  hook: Vec3,
  vertical: Vec3,
  us: readonly Vec3[],
  tensionsN: readonly number[],
  slack: readonly boolean[],
  method: SolveMethod,
  warnings: SolveWarning[],
): SolveOutcome {
  const weightN = load.massKg * STANDARD_GRAVITY_MS2;
  const legs = buildLegs(points, lengthsM, us, tensionsN, slack, vertical, weightN);
  const weightKn = weightN / 1000;
  const positions = points.map((p) => p.position);
  const rating = rateBridle(legs, positions, load.cog, vertical, weightKn);
  if (points.length === 4 && method === "elastic") {
    warnings.push({
      code: "FOUR_LEG_INDETERMINATE",
      message: `Four legs share the load in proportions that depend on their exact lengths; the leg loads shown are the elastic share for equal slings. Rate each leg for ${Math.ceil(rating.designTensionKg)} kg: ${rating.rule}`,
    });
  }
  return {
    ok: true,
    solution: {
      mode,
      weightKn,
      method,
      hook,
      vertical,
      tiltDeg: angleBetweenDeg(vertical, Z_UP),
      legs,
      warnings,
      rating,
    },
  };
}

/**
 * Level lift: hook at height hookZM (component frame, m) plumb over the CoG; 1-4 legs.
 * Returns leg lengths (m) and tensions, or a refusal saying what to change.
 */
export function solveLevel(load: BridleLoad, points: readonly LiftPoint[], hookZM: number): SolveOutcome {
  const g = load.cog;
  const n = points.length;
  if (n < 1 || n > 4) return fail("DEGENERATE_LIFT_POINTS", "Use 1 to 4 lift points.");
  if (!(hookZM > g.z + GEOMETRY_TOL_M)) {
    return fail(
      "HOOK_NOT_ABOVE_COG",
      `The hook at z = ${mm(hookZM)} is not above the CoG at z = ${mm(g.z)}; raise the hook above the CoG so the load can hang from it.`,
    );
  }
  const hook: Vec3 = { x: g.x, y: g.y, z: hookZM };
  const weightN = load.massKg * STANDARD_GRAVITY_MS2;
  const lengths: number[] = [];
  const us: Vec3[] = [];
  for (const p of points) {
    const d = sub(hook, p.position);
    const len = Math.sqrt(d.x * d.x + d.y * d.y + d.z * d.z);
    if (!(len > GEOMETRY_TOL_M)) {
      return fail("ZERO_LENGTH_LEG", `Lift point ${p.id} is at the hook point, so its leg would have no length; raise the hook or move the lift point.`);
    }
    if (!(d.z > GEOMETRY_TOL_M)) {
      return fail(
        "HOOK_NOT_ABOVE_LIFT_POINT",
        `The hook is not above lift point ${p.id}, so its leg cannot hang up to the hook; raise the hook above all lift points.`,
      );
    }
    lengths.push(len);
    us.push({ x: d.x / len, y: d.y / len, z: d.z / len });
  }
  const warnings: SolveWarning[] = [];
  const slack = new Array<boolean>(n).fill(false);
  const all = points.map((_, i) => i);

  if (n === 1) {
    const p = points[0]!.position;
    const off = Math.hypot(p.x - g.x, p.y - g.y);
    if (off > GEOMETRY_TOL_M) {
      return fail(
        "NOT_ON_PLUMB_LINE",
        `Lift point ${points[0]!.id} is ${mm(off)} off the plumb line through the CoG, so a single leg would tilt the load; move the lift point over the CoG or use more legs.`,
      );
    }
    if (p.z < g.z - GEOMETRY_TOL_M) {
      return fail("COG_ABOVE_LIFT_POINT", `The CoG is above lift point ${points[0]!.id}, so the load would turn over on a single leg; lift from a point above the CoG.`);
    }
    if (p.z <= g.z + GEOMETRY_TOL_M) {
      warnings.push({ code: "NEUTRAL_STABILITY", message: `The CoG is level with lift point ${points[0]!.id}: the load can turn freely about it; lift from a point above the CoG.` });
    }
    return finish("level", load, points, lengths, hook, Z_UP, us, [weightN], slack, "determinate", warnings);
  }

  if (n === 2) {
    const a = points[0]!;
    const b = points[1]!;
    const ex = b.position.x - a.position.x;
    const ey = b.position.y - a.position.y;
    const dxy = Math.hypot(ex, ey);
    if (!(dxy > GEOMETRY_TOL_M)) {
      return fail("DEGENERATE_LIFT_POINTS", `Lift points ${a.id} and ${b.id} are one above the other in plan, so two legs cannot steady the load; spread the lift points apart.`);
    }
    const gx = g.x - a.position.x;
    const gy = g.y - a.position.y;
    const offPlane = (ex * gy - ey * gx) / dxy;
    if (Math.abs(offPlane) > GEOMETRY_TOL_M) {
      const rolled = solveGivenLengths(load, points, lengths);
      const roll = rolled.ok ? `${rolled.solution.tiltDeg.toFixed(1)} deg` : "over";
      return fail(
        "COG_OFF_LEG_PLANE",
        `The CoG is ${mm(Math.abs(offPlane))} off the vertical plane through lift points ${a.id} and ${b.id}, so on these legs the load would roll ${roll}; move the lift points so the CoG lies on the line between them in plan, or use 3 or 4 legs.`,
      );
    }
    const t = (ex * gx + ey * gy) / (dxy * dxy);
    const zLine = a.position.z + t * (b.position.z - a.position.z);
    const res = activeTensions(us, lengths, all, Z_UP, weightN);
    if (!res.ok) {
      if (res.kind === "negative") {
        return fail("COG_OUTSIDE_SUPPORT", `The CoG is not between lift points ${a.id} and ${b.id} in plan, so one leg would have to push; choose lift points either side of the CoG.`);
      }
      return fail("DEGENERATE_LIFT_POINTS", `Lift points ${a.id} and ${b.id} and the hook are in line; spread the lift points apart.`);
    }
    if (g.z > zLine + GEOMETRY_TOL_M) {
      return fail(
        "COG_ABOVE_LIFT_LINE",
        `The CoG is ${mm(g.z - zLine)} above the line through lift points ${a.id} and ${b.id}, so the load would turn over about them; lift from points above the CoG or use 3 or 4 legs.`,
      );
    }
    if (g.z > zLine - GEOMETRY_TOL_M) {
      warnings.push({ code: "NEUTRAL_STABILITY", message: `The CoG is on the line through lift points ${a.id} and ${b.id}: the load can turn freely about it; steady it with a tag line or lift from points above the CoG.` });
    }
    return finish("level", load, points, lengths, hook, Z_UP, us, res.tensionsN, slack, "determinate", warnings);
  }

  const res = activeTensions(us, lengths, all, Z_UP, weightN);
  if (res.ok) {
    if (n === 3 && res.conditioning < ILL_CONDITIONED_DET) {
      warnings.push({ code: "ILL_CONDITIONED", message: `Lift points ${names(points, all)} are nearly in line in plan: small errors in the CoG change the leg loads a lot; spread the lift points.` });
    }
    return finish("level", load, points, lengths, hook, Z_UP, us, res.tensionsN, slack, res.method, warnings);
  }
  if (res.kind === "degenerate") {
    return fail("DEGENERATE_LIFT_POINTS", `Lift points ${names(points, all)} are in line in plan or in one plane with the hook, so their legs cannot hold the load steady; spread the lift points or raise the hook.`);
  }
  if (n === 3) {
    return fail("COG_OUTSIDE_SUPPORT", `The CoG's plumb point falls outside the triangle of lift points ${names(points, all)}, so the load would tip; choose lift points around the CoG.`);
  }
  // Four legs, one would go into compression in the elastic share: it goes slack, three carry.
  const dropped = res.index ?? 0;
  const three = all.filter((i) => i !== dropped);
  const res3 = activeTensions(us, lengths, three, Z_UP, weightN);
  if (!res3.ok) {
    return fail(
      res3.kind === "degenerate" ? "DEGENERATE_LIFT_POINTS" : "COG_OUTSIDE_SUPPORT",
      `The CoG's plumb point falls outside the area of lift points ${names(points, all)}, so the load would tip; choose lift points around the CoG.`,
    );
  }
  slack[dropped] = true;
  warnings.push({
    code: "LEG_SLACK",
    message: `Leg ${points[dropped]!.id} goes slack: the CoG is so close to the other three lift points that they carry the load alone; rate those three legs for it.`,
  });
  return finish("level", load, points, lengths, hook, Z_UP, us, res3.tensionsN, slack, "determinate", warnings);
}

/** Point of leg i's sphere farthest from G (one taut leg). */
function sphereCandidate(cog: Vec3, p: Vec3, lengthM: number): Vec3 {
  const dir = normalize(sub(p, cog)) ?? Z_UP;
  return { x: p.x + lengthM * dir.x, y: p.y + lengthM * dir.y, z: p.z + lengthM * dir.z };
}

/** Point of the circle where two legs' spheres meet that is farthest from G, or null when they do not meet. */
function circleCandidate(cog: Vec3, pi: Vec3, li: number, pj: Vec3, lj: number): Vec3 | null {
  const d = distance(pi, pj);
  if (!(d > GEOMETRY_TOL_M) || d > li + lj || d < Math.abs(li - lj)) return null;
  const axis = { x: (pj.x - pi.x) / d, y: (pj.y - pi.y) / d, z: (pj.z - pi.z) / d };
  const a = (li * li - lj * lj + d * d) / (2 * d);
  const r = Math.sqrt(Math.max(0, li * li - a * a));
  const c = { x: pi.x + a * axis.x, y: pi.y + a * axis.y, z: pi.z + a * axis.z };
  const gc = sub(cog, c);
  const along = dot(gc, axis);
  const gPerp = { x: gc.x - along * axis.x, y: gc.y - along * axis.y, z: gc.z - along * axis.z };
  let e = normalize({ x: -gPerp.x, y: -gPerp.y, z: -gPerp.z }, 1e-12);
  if (e === null) {
    // G on the axis: every point of the circle is as far; take the highest one.
    e = normalize({ x: -axis.z * axis.x, y: -axis.z * axis.y, z: 1 - axis.z * axis.z }) ?? perpendicular(axis);
  }
  return { x: c.x + r * e.x, y: c.y + r * e.y, z: c.z + r * e.z };
}

/** The two points where three legs' spheres meet (empty when they do not). */
function threeSphereCandidates(pi: Vec3, li: number, pj: Vec3, lj: number, pk: Vec3, lk: number): Vec3[] {
  const d = distance(pi, pj);
  if (!(d > GEOMETRY_TOL_M)) return [];
  const ex = { x: (pj.x - pi.x) / d, y: (pj.y - pi.y) / d, z: (pj.z - pi.z) / d };
  const pk0 = sub(pk, pi);
  const ii = dot(ex, pk0);
  const eyRaw = { x: pk0.x - ii * ex.x, y: pk0.y - ii * ex.y, z: pk0.z - ii * ex.z };
  const jj = Math.sqrt(dot(eyRaw, eyRaw));
  if (!(jj > GEOMETRY_TOL_M)) return [];
  const ey = { x: eyRaw.x / jj, y: eyRaw.y / jj, z: eyRaw.z / jj };
  const ez = cross(ex, ey);
  const x = (li * li - lj * lj + d * d) / (2 * d);
  const y = (li * li - lk * lk + ii * ii + jj * jj) / (2 * jj) - (ii / jj) * x;
  const z2 = li * li - x * x - y * y;
  if (z2 < -2 * FEASIBLE_TOL_M * li) return [];
  const z = Math.sqrt(Math.max(0, z2));
  return [z, -z].map((s) => ({
    x: pi.x + x * ex.x + y * ey.x + s * ez.x,
    y: pi.y + x * ex.y + y * ey.y + s * ez.y,
    z: pi.z + x * ex.z + y * ey.z + s * ez.z,
  }));
}

function isFeasible(h: Vec3, positions: readonly Vec3[], lengthsM: readonly number[], tolM: number): boolean {
  for (let m = 0; m < positions.length; m++) {
    if (distance(h, positions[m]!) > lengthsM[m]! + tolM + 1e-12 * lengthsM[m]!) return false;
  }
  return true;
}

/**
 * Hook point for given-lengths mode (component frame, m): the candidate with 1, 2 or 3 taut legs
 * farthest from the CoG among those within reach of every leg; null when the legs cannot meet.
 */
export function findHangingHook(cog: Vec3, positions: readonly Vec3[], lengthsM: readonly number[]): Vec3 | null {
  const n = positions.length;
  let best: Vec3 | null = null;
  let bestDist = -1;
  const consider = (h: Vec3 | null): void => {
    if (h === null || !isFeasible(h, positions, lengthsM, FEASIBLE_TOL_M)) return;
    const d = distance(h, cog);
    if (d > bestDist) {
      bestDist = d;
      best = h;
    }
  };
  for (let i = 0; i < n; i++) consider(sphereCandidate(cog, positions[i]!, lengthsM[i]!));
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) consider(circleCandidate(cog, positions[i]!, lengthsM[i]!, positions[j]!, lengthsM[j]!));
  }
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      for (let k = j + 1; k < n; k++) {
        for (const h of threeSphereCandidates(positions[i]!, lengthsM[i]!, positions[j]!, lengthsM[j]!, positions[k]!, lengthsM[k]!)) consider(h);
      }
    }
  }
  return best;
}

/** Candidate for exactly the given taut legs (1 or 2), used after a leg turns out slack. */
function candidateForActive(cog: Vec3, positions: readonly Vec3[], lengthsM: readonly number[], active: readonly number[]): Vec3 | null {
  const i = active[0];
  const j = active[1];
  if (i === undefined) return null;
  if (active.length === 1) return sphereCandidate(cog, positions[i]!, lengthsM[i]!);
  if (active.length === 2 && j !== undefined) return circleCandidate(cog, positions[i]!, lengthsM[i]!, positions[j]!, lengthsM[j]!);
  return null;
}

/**
 * Given-lengths check: legs of lengthsM (m, same order as points) from one hook; the load settles
 * with its CoG as far below the hook as the legs allow. Reports tilt and tensions; slack legs carry 0.
 */
export function solveGivenLengths(load: BridleLoad, points: readonly LiftPoint[], lengthsM: readonly number[]): SolveOutcome {
  const n = points.length;
  if (n < 1 || n > 4 || lengthsM.length !== n) return fail("DEGENERATE_LIFT_POINTS", "Give one leg length for each of 1 to 4 lift points.");
  for (let i = 0; i < n; i++) {
    if (!(lengthsM[i]! > GEOMETRY_TOL_M)) {
      return fail("ZERO_LENGTH_LEG", `The leg to lift point ${points[i]!.id} has no length; give it the length of the sling.`);
    }
  }
  const positions = points.map((p) => p.position);
  let hook = findHangingHook(load.cog, positions, lengthsM);
  if (hook === null) {
    return fail("LEGS_CANNOT_MEET", `Legs of these lengths cannot meet at one hook: some lift points are farther apart than their two legs reach; use longer slings.`);
  }
  const weightN = load.massKg * STANDARD_GRAVITY_MS2;
  let us: Vec3[] = [];
  let vertical: Vec3 = Z_UP;
  const active: number[] = [];
  const slack = new Array<boolean>(n).fill(true);
  const frame = (h: Vec3): boolean => {
    const v = normalize(sub(h, load.cog));
    if (v === null) return false;
    vertical = v;
    us = positions.map((p) => normalize(sub(h, p)) ?? v);
    return true;
  };
  if (!frame(hook)) return fail("NO_EQUILIBRIUM", "The hook would sit at the CoG; use longer slings.");
  for (let i = 0; i < n; i++) {
    if (distance(hook, positions[i]!) >= lengthsM[i]! - TAUT_TOL_M) active.push(i);
  }
  // A taut leg that would need to push is only touching: it goes slack and the hook settles on
  // the remaining taut legs (recomputed so that the reduced set is in exact equilibrium).
  let res = activeTensions(us, lengthsM, active, vertical, weightN);
  while (!res.ok && res.kind === "negative" && active.length > 1) {
    const at = active.indexOf(res.index ?? -1);
    if (at < 0) break;
    active.splice(at, 1);
    const settled = candidateForActive(load.cog, positions, lengthsM, active);
    if (settled !== null && isFeasible(settled, positions, lengthsM, TAUT_TOL_M) && frame(settled)) hook = settled;
    res = activeTensions(us, lengthsM, active, vertical, weightN);
  }
  if (!res.ok) {
    for (const i of active) {
      for (const j of active) {
        if (dot(us[i]!, us[j]!) < -0.99) {
          return fail(
            "LEGS_NEARLY_STRAIGHT",
            `The legs to lift points ${points[i]!.id} and ${points[j]!.id} would be pulled almost straight between them, with leg loads many times the load's weight; use longer slings.`,
          );
        }
      }
    }
    return fail("NO_EQUILIBRIUM", `The taut legs to lift points ${names(points, active)} cannot hold the load steady; spread the lift points or change the sling lengths.`);
  }
  for (const i of active) slack[i] = false;
  const warnings: SolveWarning[] = [];
  const tiltDeg = angleBetweenDeg(vertical, Z_UP);
  if (tiltDeg > TILT_WARN_DEG) {
    warnings.push({ code: "LOAD_TILTS", message: `On these sling lengths the load hangs tilted by ${tiltDeg.toFixed(2)} deg; adjust the leg lengths to hang it level.` });
  }
  for (let i = 0; i < n; i++) {
    if (slack[i]) {
      warnings.push({ code: "LEG_SLACK", message: `Leg ${points[i]!.id} is slack and carries nothing; the other legs carry the load.` });
    }
  }
  return finish("lengths", load, points, lengthsM, hook, vertical, us, res.tensionsN, slack, res.method, warnings);
}
