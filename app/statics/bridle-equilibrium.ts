// Equilibrium of the taut legs at the hook point, and the solution record both modes return.
// Closed-form 1-3 leg solves (Cramer's rule on 3x3 matrices) and the 4-leg elastic share.
import { rateBridle } from "./bridle-rating";
import {
  MIN_DIRECTION_DET,
  NEGATIVE_TENSION_TOL,
  Z_UP,
  type BridleLoad,
  type LegResult,
  type LiftPoint,
  type SolveMethod,
  type SolveMode,
  type SolveOutcome,
  type SolveWarning,
} from "./bridle-types";
import { STANDARD_GRAVITY_MS2 } from "./units";
import { angleBetweenDeg, columns3, det3, distance, dot, solve3, type Mat3, type Vec3 } from "./vector";

export type TensionResult =
  | { ok: true; tensionsN: number[]; method: SolveMethod; conditioning: number }
  | { ok: false; kind: "degenerate" | "negative" | "residual"; index?: number };

/**
 * Tensions (N) of the active legs balancing weightN along `vertical`.
 * us: unit leg vectors (P -> H); lengths for the elastic stiffness 1/L.
 */
export function activeTensions(
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

/** Per-leg results: length, tension, angles against the true vertical and the lift point's axis. */
export function buildLegs(
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

/** The solution record of either mode, with the multi-leg rating and the 4-leg warning. */
export function finish(
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
  const rating = rateBridle(legs, positions, load.cog, vertical, weightKn, method);
  if (points.length === 4 && method === "elastic") {
    warnings.push({
      code: "FOUR_LEG_INDETERMINATE",
      message: `Four legs share the load in proportions that depend on their exact lengths; the leg loads shown are the elastic share for equal slings. Rate each leg for its design tension, up to ${Math.ceil(rating.designTensionKg)} kg: ${rating.rule}`,
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
