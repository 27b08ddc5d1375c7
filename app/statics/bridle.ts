// Bridle statics: legs from one hook point H to the lift points of a rigid load.
// Level mode (here) puts H plumb over G at a given height; given-lengths mode (bridle-lengths.ts)
// finds where the load settles on slings of known length; bridle-rating.ts rates the legs by the
// multi-leg rules. Closed-form 3x3 math throughout (no allocation-heavy libs). This module is the
// entry the rest of the app imports from.
import { activeTensions, finish } from "./bridle-equilibrium";
import { solveGivenLengths } from "./bridle-lengths";
import {
  GEOMETRY_TOL_M,
  ILL_CONDITIONED_DET,
  Z_UP,
  fail,
  mm,
  names,
  pullsFromBelowSurface,
  type BridleLoad,
  type LiftPoint,
  type SolveOutcome,
  type SolveWarning,
} from "./bridle-types";
import { STANDARD_GRAVITY_MS2 } from "./units";
import { angleBetweenDeg, dot, sub, type Vec3 } from "./vector";

export { findHangingHook, solveGivenLengths } from "./bridle-lengths";
export { rateBridle } from "./bridle-rating";
export {
  GEOMETRY_TOL_M,
  SYMMETRY_ANGLE_TOL_DEG,
  SYMMETRY_TENSION_TOL,
  TAUT_TOL_M,
  type BridleLoad,
  type BridleRating,
  type BridleSolution,
  type DesignGovernor,
  type LegDesignTension,
  type LegResult,
  type LiftPoint,
  type SolveErrorCode,
  type SolveMethod,
  type SolveMode,
  type SolveOutcome,
  type SolveWarning,
} from "./bridle-types";

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
      return fail(
        "ZERO_LENGTH_LEG",
        `Lift point ${p.id} is at the hook point, so its leg would have no length; raise the hook or move the lift point.`,
      );
    }
    if (!(d.z > GEOMETRY_TOL_M)) {
      return fail(
        "HOOK_NOT_ABOVE_LIFT_POINT",
        `The hook is not above lift point ${p.id}, so its leg cannot hang up to the hook; raise the hook above all lift points.`,
      );
    }
    // The given-lengths side rule holds here too: a leg leaves its lift point outward along the lift point's axis.
    // Level, with the hook plumb over the CoG, a leg that would pull into the part is refused with the same code.
    if (!(dot(d, p.axis) > GEOMETRY_TOL_M)) {
      return fail(
        "LOAD_TURNS_OVER",
        `Hanging level with the hook plumb over the CoG, ${pullsFromBelowSurface(p.id)} (${angleBetweenDeg(d, p.axis).toFixed(0)} deg from its axis), so the load will turn over; use lift points whose axes face the hook, or raise the hook.`,
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
      return fail(
        "COG_ABOVE_LIFT_POINT",
        `The CoG is above lift point ${points[0]!.id}, so the load would turn over on a single leg; lift from a point above the CoG.`,
      );
    }
    if (p.z <= g.z + GEOMETRY_TOL_M) {
      warnings.push({
        code: "NEUTRAL_STABILITY",
        message: `The CoG is level with lift point ${points[0]!.id}: the load can turn freely about it; lift from a point above the CoG.`,
      });
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
      return fail(
        "DEGENERATE_LIFT_POINTS",
        `Lift points ${a.id} and ${b.id} are one above the other in plan, so two legs cannot steady the load; spread the lift points apart.`,
      );
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
        return fail(
          "COG_OUTSIDE_SUPPORT",
          `The CoG is not between lift points ${a.id} and ${b.id} in plan, so one leg would have to push; choose lift points either side of the CoG.`,
        );
      }
      return fail(
        "DEGENERATE_LIFT_POINTS",
        `Lift points ${a.id} and ${b.id} and the hook are in line; spread the lift points apart.`,
      );
    }
    if (g.z > zLine + GEOMETRY_TOL_M) {
      return fail(
        "COG_ABOVE_LIFT_LINE",
        `The CoG is ${mm(g.z - zLine)} above the line through lift points ${a.id} and ${b.id}, so the load would turn over about them; lift from points above the CoG or use 3 or 4 legs.`,
      );
    }
    if (g.z > zLine - GEOMETRY_TOL_M) {
      warnings.push({
        code: "NEUTRAL_STABILITY",
        message: `The CoG is on the line through lift points ${a.id} and ${b.id}: the load can turn freely about it; steady it with a tag line or lift from points above the CoG.`,
      });
    }
    return finish("level", load, points, lengths, hook, Z_UP, us, res.tensionsN, slack, "determinate", warnings);
  }

  const res = activeTensions(us, lengths, all, Z_UP, weightN);
  if (res.ok) {
    if (n === 3 && res.conditioning < ILL_CONDITIONED_DET) {
      warnings.push({
        code: "ILL_CONDITIONED",
        message: `Lift points ${names(points, all)} are nearly in line in plan: small errors in the CoG change the leg loads a lot; spread the lift points.`,
      });
    }
    return finish("level", load, points, lengths, hook, Z_UP, us, res.tensionsN, slack, res.method, warnings);
  }
  if (res.kind === "degenerate") {
    return fail(
      "DEGENERATE_LIFT_POINTS",
      `Lift points ${names(points, all)} are in line in plan or in one plane with the hook, so their legs cannot hold the load steady; spread the lift points or raise the hook.`,
    );
  }
  if (n === 3) {
    return fail(
      "COG_OUTSIDE_SUPPORT",
      `The CoG's plumb point falls outside the triangle of lift points ${names(points, all)}, so the load would tip; choose lift points around the CoG.`,
    );
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
