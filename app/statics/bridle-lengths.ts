// Given-lengths mode: where a rigid load settles on slings of known length from one hook, and the
// leg loads there. In the component frame the hook point H is a stable local maximum of |H - G| (the
// CoG hangs as far below the hook as the slings allow) within reach of every sling: the one the load
// swings to from lift-off (bridle-settle.ts). Each taut leg leaves its lift point outward along the
// lift point's axis, so the hook is above the lift points; a load that would turn over is refused.
import { activeTensions, finish, type TensionResult } from "./bridle-equilibrium";
import { settleFromLiftOff } from "./bridle-settle";
import {
  FEASIBLE_TOL_M,
  GEOMETRY_TOL_M,
  TAUT_TOL_M,
  TILT_WARN_DEG,
  Z_UP,
  fail,
  names,
  pullsFromBelowSurface,
  type BridleLoad,
  type LiftPoint,
  type SolveOutcome,
  type SolveWarning,
} from "./bridle-types";
import { STANDARD_GRAVITY_MS2 } from "./units";
import { angleBetweenDeg, cross, distance, dot, normalize, perpendicular, sub, type Vec3 } from "./vector";

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

/** Candidate for exactly the given taut legs (1 or 2), used after a leg turns out slack. */
function candidateForActive(
  cog: Vec3,
  positions: readonly Vec3[],
  lengthsM: readonly number[],
  active: readonly number[],
): Vec3 | null {
  const i = active[0];
  const j = active[1];
  if (i === undefined) return null;
  if (active.length === 1) return sphereCandidate(cog, positions[i]!, lengthsM[i]!);
  if (active.length === 2 && j !== undefined)
    return circleCandidate(cog, positions[i]!, lengthsM[i]!, positions[j]!, lengthsM[j]!);
  return null;
}

interface Candidate {
  hook: Vec3;
  distM: number;
}

/**
 * Every point where 1, 2 or 3 legs are taut and G is locally as far as those legs allow (the farthest
 * point of a sphere or of a two-sphere circle, and both three-sphere points), kept when within reach
 * of every leg, farthest from G first.
 */
function hangingCandidates(cog: Vec3, positions: readonly Vec3[], lengthsM: readonly number[]): Candidate[] {
  const n = positions.length;
  const out: Candidate[] = [];
  const consider = (h: Vec3 | null): void => {
    if (h !== null && isFeasible(h, positions, lengthsM, FEASIBLE_TOL_M))
      out.push({ hook: h, distM: distance(h, cog) });
  };
  for (let i = 0; i < n; i++) consider(sphereCandidate(cog, positions[i]!, lengthsM[i]!));
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++)
      consider(circleCandidate(cog, positions[i]!, lengthsM[i]!, positions[j]!, lengthsM[j]!));
  }
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      for (let k = j + 1; k < n; k++) {
        for (const h of threeSphereCandidates(
          positions[i]!,
          lengthsM[i]!,
          positions[j]!,
          lengthsM[j]!,
          positions[k]!,
          lengthsM[k]!,
        ))
          consider(h);
      }
    }
  }
  return out.sort((a, b) => b.distM - a.distM);
}

function nearestCandidate(candidates: readonly Candidate[], point: Vec3, withinM: number): Candidate | null {
  let nearest: Candidate | null = null;
  let nearestD = withinM;
  for (const c of candidates) {
    const d = distance(c.hook, point);
    if (d <= nearestD) {
      nearestD = d;
      nearest = c;
    }
  }
  return nearest;
}

/**
 * The point within reach of every leg farthest from the CoG, on either side of the lift points
 * (the global maximum of |H - G|); null when the legs cannot meet. solveGivenLengths keeps to the
 * side the legs leave from, so its hook can be nearer.
 */
export function findHangingHook(cog: Vec3, positions: readonly Vec3[], lengthsM: readonly number[]): Vec3 | null {
  return hangingCandidates(cog, positions, lengthsM)[0]?.hook ?? null;
}

/** Each leg leaves its lift point outward: (H - P_i) . a_i > 0 (beyond GEOMETRY_TOL_M) for every taut leg i. */
function leavesOutward(hook: Vec3, points: readonly LiftPoint[], active: readonly number[]): boolean {
  for (const i of active) {
    const p = points[i]!;
    if (!(dot(sub(hook, p.position), p.axis) > GEOMETRY_TOL_M)) return false;
  }
  return true;
}

function tautLegs(hook: Vec3, positions: readonly Vec3[], lengthsM: readonly number[]): number[] {
  const active: number[] = [];
  for (let i = 0; i < positions.length; i++) {
    if (distance(hook, positions[i]!) >= lengthsM[i]! - TAUT_TOL_M) active.push(i);
  }
  return active;
}

interface Settled {
  hook: Vec3;
  vertical: Vec3;
  us: Vec3[];
  active: number[];
  res: Extract<TensionResult, { ok: true }>;
}

/**
 * The load hanging with the hook at a candidate point, when it is an equilibrium there: the taut
 * legs balance the weight along (H - G) with tensions >= 0. A taut leg that would have to push is
 * only touching: it goes slack and the hook settles on the remaining taut legs (re-placed so that
 * they balance exactly); of four taut legs that cannot share the load, three may carry it.
 */
function settleAt(
  start: Vec3,
  load: BridleLoad,
  points: readonly LiftPoint[],
  positions: readonly Vec3[],
  lengthsM: readonly number[],
  weightN: number,
): Settled | null {
  let hook = start;
  const active = tautLegs(hook, positions, lengthsM);
  let vertical = normalize(sub(hook, load.cog));
  if (vertical === null) return null;
  const frame = (h: Vec3): Vec3[] => {
    const v = vertical!;
    return positions.map((p) => normalize(sub(h, p)) ?? v);
  };
  let us = frame(hook);
  let res = activeTensions(us, lengthsM, active, vertical, weightN);
  if (!res.ok && res.kind === "negative" && active.length === 4) {
    // Four taut legs whose elastic share would push: try each three, the pushing leg slack first.
    const pushing = res.index ?? active[0]!;
    const order = [pushing, ...active.filter((i) => i !== pushing)];
    for (const drop of order) {
      const three = active.filter((i) => i !== drop);
      const r3 = activeTensions(us, lengthsM, three, vertical, weightN);
      if (r3.ok) return { hook, vertical, us, active: three, res: r3 };
    }
  }
  while (!res.ok && res.kind === "negative" && active.length > 1) {
    const at = active.indexOf(res.index ?? -1);
    if (at < 0) break;
    active.splice(at, 1);
    const settled = candidateForActive(load.cog, positions, lengthsM, active);
    if (
      settled !== null &&
      isFeasible(settled, positions, lengthsM, TAUT_TOL_M) &&
      leavesOutward(settled, points, active)
    ) {
      const v = normalize(sub(settled, load.cog));
      if (v !== null) {
        hook = settled;
        vertical = v;
        us = frame(hook);
      }
    }
    res = activeTensions(us, lengthsM, active, vertical, weightN);
  }
  return res.ok ? { hook, vertical, us, active, res } : null;
}

/**
 * Refusal when the load has no stable position on the side the legs leave from: it turns over. One leg
 * with the CoG not below its lift point, and two with the CoG not below the line through theirs, get
 * level mode's codes; anything else (three or four legs, or slings so uneven that the load swings a leg
 * past its lift point's surface) is LOAD_TURNS_OVER. `leg` is the leg that would pass, when known.
 */
function turnsOver(points: readonly LiftPoint[], cog: Vec3, leg: number): SolveOutcome {
  const n = points.length;
  const all = points.map((_, i) => i);
  if (n === 1 && !(cog.z < points[0]!.position.z - GEOMETRY_TOL_M)) {
    return fail(
      "COG_ABOVE_LIFT_POINT",
      `The CoG is not below lift point ${points[0]!.id}, so on this sling the load will turn over and hang upside down; lift from a point above the CoG.`,
    );
  }
  if (n === 2) {
    const a = points[0]!.position;
    const b = points[1]!.position;
    const ex = b.x - a.x;
    const ey = b.y - a.y;
    const len2 = ex * ex + ey * ey;
    const t = len2 > 0 ? ((cog.x - a.x) * ex + (cog.y - a.y) * ey) / len2 : 0;
    if (len2 > 0 && !(cog.z < a.z + t * (b.z - a.z) - GEOMETRY_TOL_M)) {
      return fail(
        "COG_ABOVE_LIFT_LINE",
        `The CoG is not below the line through lift points ${names(points, all)}, so on these slings the load will turn over about them; lift from points above the CoG or use 3 or 4 legs.`,
      );
    }
  }
  const which =
    leg >= 0
      ? pullsFromBelowSurface(points[leg]!.id)
      : `no position holds it with the hook above lift points ${names(points, all)}`;
  return fail(
    "LOAD_TURNS_OVER",
    `On slings of these lengths the load swings until ${which}, so it will turn over; use sling lengths that hang it level (hook plumb over the CoG), or lift from points above the CoG.`,
  );
}

/**
 * Given-lengths check: legs of lengthsM (m, same order as points) from one hook; the load settles
 * with its CoG as far below the hook as the legs allow, each taut leg leaving its lift point outward
 * along the lift point's axis (hook above the lift points, never hanging inverted). Reports tilt and
 * tensions; slack legs carry 0. Refuses when the load would turn over.
 */
export function solveGivenLengths(
  load: BridleLoad,
  points: readonly LiftPoint[],
  lengthsM: readonly number[],
): SolveOutcome {
  const n = points.length;
  if (n < 1 || n > 4 || lengthsM.length !== n)
    return fail("DEGENERATE_LIFT_POINTS", "Give one leg length for each of 1 to 4 lift points.");
  for (let i = 0; i < n; i++) {
    if (!(lengthsM[i]! > GEOMETRY_TOL_M)) {
      return fail(
        "ZERO_LENGTH_LEG",
        `The leg to lift point ${points[i]!.id} has no length; give it the length of the sling.`,
      );
    }
  }
  const positions = points.map((p) => p.position);
  const weightN = load.massKg * STANDARD_GRAVITY_MS2;
  const hang = (start: Vec3): SolveOutcome | null => {
    if (
      !isFeasible(start, positions, lengthsM, TAUT_TOL_M) ||
      !leavesOutward(start, points, tautLegs(start, positions, lengthsM))
    )
      return null;
    const s = settleAt(start, load, points, positions, lengthsM, weightN);
    if (s === null) return null;
    const slack = new Array<boolean>(n).fill(true);
    for (const i of s.active) slack[i] = false;
    const warnings: SolveWarning[] = [];
    const tiltDeg = angleBetweenDeg(s.vertical, Z_UP);
    if (tiltDeg > TILT_WARN_DEG) {
      warnings.push({
        code: "LOAD_TILTS",
        message: `On these sling lengths the load hangs tilted by ${tiltDeg.toFixed(2)} deg; adjust the leg lengths to hang it level.`,
      });
    }
    for (let i = 0; i < n; i++) {
      if (slack[i])
        warnings.push({
          code: "LEG_SLACK",
          message: `Leg ${points[i]!.id} is slack and carries nothing; the other legs carry the load.`,
        });
    }
    return finish(
      "lengths",
      load,
      points,
      lengthsM,
      s.hook,
      s.vertical,
      s.us,
      s.res.tensionsN,
      slack,
      s.res.method,
      warnings,
    );
  };
  // Follow the load from lift-off (level, hook plumb over the CoG) to where it comes to rest.
  const path = settleFromLiftOff(
    load.cog,
    positions,
    points.map((p) => p.axis),
    lengthsM,
  );
  let turnedOver = path.kind === "turns-over";
  if (path.kind === "rest") {
    const rest = hang(path.hook);
    if (rest !== null) return rest;
  }
  const candidates = hangingCandidates(load.cog, positions, lengthsM);
  if (candidates.length === 0) {
    return fail(
      "LEGS_CANNOT_MEET",
      `Legs of these lengths cannot meet at one hook: some lift points are farther apart than their two legs reach; use longer slings.`,
    );
  }
  if (path.kind === "rest") {
    // The rest point does not balance within rounding: take the exact candidate it reached.
    const nearest = nearestCandidate(candidates, path.hook, 1e-7 * Math.max(1, ...lengthsM));
    const rest = nearest === null ? null : hang(nearest.hook);
    if (rest !== null) return rest;
  }
  if (path.kind !== "turns-over") {
    // No start over the CoG (or a degenerate path): the farthest equilibrium on the outward side.
    for (const c of candidates) {
      if (!leavesOutward(c.hook, points, tautLegs(c.hook, positions, lengthsM))) {
        turnedOver = true;
        continue;
      }
      const rest = hang(c.hook);
      if (rest !== null) return rest;
    }
  }
  // No equilibrium on the outward side. Legs pulled straight between two lift points come first.
  const farthest = candidates[0]!.hook;
  const active = tautLegs(farthest, positions, lengthsM);
  const us = positions.map((p) => normalize(sub(farthest, p)) ?? Z_UP);
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
  if (turnedOver) return turnsOver(points, load.cog, path.kind === "turns-over" ? path.leg : -1);
  return fail(
    "NO_EQUILIBRIUM",
    `The taut legs to lift points ${names(points, active)} cannot hold the load steady; spread the lift points or change the sling lengths.`,
  );
}
