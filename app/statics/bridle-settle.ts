// Where a load lifted from the ground comes to rest on slings of given length. It starts level,
// the hook plumb over the CoG at the highest point every sling reaches (the moment it lifts off),
// then swings down to the first stable position: in the component frame the hook point H moves
// the way |H - G| grows fastest while no sling is longer than its length (steepest ascent on the
// intersection of the slings' balls). The path is followed exactly: straight lines while every leg
// is slack, meridians of one leg's sphere, arcs of two legs' circle; each event (another leg going
// taut, a leg going slack, a taut leg passing its lift point's surface) is the root of
// A cos t + B sin t + C along the arc, found in closed form.
import { GEOMETRY_TOL_M, TAUT_TOL_M } from "./bridle-types";
import { columns3, cross, distance, dot, normalize, solve3, sub, type Vec3 } from "./vector";

export type SettleResult =
  /** Came to rest at a stable position; `carrying` are the taut legs that hold it there. */
  | { kind: "rest"; hook: Vec3; carrying: number[] }
  /** Taut leg `leg` would pass its lift point's outward plane: the load turns over. */
  | { kind: "turns-over"; leg: number }
  /** No start over the CoG, or a degenerate path: let the caller decide another way. */
  | { kind: "unknown" };

const MAX_MOVES = 64;
/** Events closer than this (rad, or m along a line) to the start of a move are not events. */
const EPS_MOVE = 1e-12;
/** A projected gradient below this means a stable position (unit gradient). */
const REST_GRADIENT = 1e-9;
const TWO_PI = 2 * Math.PI;

/** Highest point of the plumb line through G within reach of every leg, or null. */
export function liftOffHook(cog: Vec3, positions: readonly Vec3[], lengthsM: readonly number[]): Vec3 | null {
  let top = Infinity;
  let bottom = -Infinity;
  for (let i = 0; i < positions.length; i++) {
    const p = positions[i]!;
    const h2 = lengthsM[i]! * lengthsM[i]! - ((p.x - cog.x) ** 2 + (p.y - cog.y) ** 2);
    if (h2 < 0) return null;
    const h = Math.sqrt(h2);
    top = Math.min(top, p.z + h);
    bottom = Math.max(bottom, p.z - h);
  }
  if (!(top >= bottom) || !(top > cog.z + GEOMETRY_TOL_M)) return null;
  return { x: cog.x, y: cog.y, z: top };
}

interface ConeProjection {
  d: Vec3;
  /** Legs that stay taut during the move (their multipliers are >= 0). */
  keep: number[];
}

/**
 * Steepest ascent direction at a point where the legs in `taut` are taut: the projection d of v onto
 * the cone {d : d . u_i <= 0}. By Moreau's decomposition d = v - sum mu_i u_i with mu >= 0 the
 * non-negative least-squares fit of v by the u_i, which is the best of the subsets' fits with mu >= 0.
 */
function projectOnCone(v: Vec3, us: readonly Vec3[], taut: readonly number[]): ConeProjection | null {
  const m = taut.length;
  if (m >= 3) {
    // Fast path (a level hang, every leg taut): v within the cone of three taut legs is a rest point.
    for (let drop = m === 3 ? -1 : 0; drop < m; drop++) {
      const keep = drop < 0 ? taut : taut.filter((_, k) => k !== drop);
      if (keep.length !== 3) continue;
      const mu = multipliers(v, [us[keep[0]!]!, us[keep[1]!]!, us[keep[2]!]!]);
      if (mu !== null && mu[0]! >= -1e-12 && mu[1]! >= -1e-12 && mu[2]! >= -1e-12)
        return { d: { x: 0, y: 0, z: 0 }, keep: [...keep] };
    }
  }
  let best: ConeProjection | null = null;
  let bestNorm = Infinity;
  for (let mask = 0; mask < 1 << m; mask++) {
    const keep = taut.filter((_, k) => (mask >> k) & 1);
    const mu = multipliers(
      v,
      keep.map((i) => us[i]!),
    );
    if (mu === null || mu.some((x) => x < -1e-12)) continue;
    let d = v;
    keep.forEach((i, k) => {
      const u = us[i]!;
      d = { x: d.x - mu[k]! * u.x, y: d.y - mu[k]! * u.y, z: d.z - mu[k]! * u.z };
    });
    const size = Math.hypot(d.x, d.y, d.z);
    // Fewer legs win a tie: a leg with mu = 0 is not needed to hold the point.
    if (size < bestNorm - 1e-15) {
      bestNorm = size;
      best = { d, keep };
    }
  }
  return best;
}

/** mu with v - sum mu_k u_k orthogonal to every u_k (Gram system), or null when the u_k are dependent. */
function multipliers(v: Vec3, us: readonly Vec3[]): number[] | null {
  if (us.length === 0) return [];
  if (us.length === 1) return [dot(v, us[0]!)];
  if (us.length === 2) {
    const c = dot(us[0]!, us[1]!);
    const det = 1 - c * c;
    if (!(det > 1e-12)) return null;
    const b0 = dot(v, us[0]!);
    const b1 = dot(v, us[1]!);
    return [(b0 - c * b1) / det, (b1 - c * b0) / det];
  }
  if (us.length === 3) {
    const s = solve3(columns3(us[0]!, us[1]!, us[2]!), v, 1e-12);
    return s === null ? null : [s.x, s.y, s.z];
  }
  return null;
}

/** Smallest t in (EPS_MOVE, end] where A cos t + B sin t + C falls below zero; Infinity when none. */
function firstDrop(a: number, b: number, c: number, end: number): number {
  const r = Math.hypot(a, b);
  if (!(r > 0)) return Infinity;
  const q = -c / r;
  if (q > 1 || q < -1) return Infinity;
  const phi = Math.atan2(b, a);
  const w = Math.acos(q);
  const roots = [phi + w, phi - w].map((t) => ((t % TWO_PI) + TWO_PI) % TWO_PI).sort((x, y) => x - y);
  for (const t of roots) {
    if (t <= EPS_MOVE || t > end) continue;
    if (-a * Math.sin(t) + b * Math.cos(t) < 0) return t;
  }
  return Infinity;
}

/** A cos t + B sin t + C of f along the arc p(t), from f at t = 0, pi/2, pi (exact for f quadratic with an |H|^2 part). */
function sinusoid(f: (h: Vec3) => number, arc: (t: number) => Vec3): [number, number, number] {
  const f0 = f(arc(0));
  const f1 = f(arc(Math.PI / 2));
  const f2 = f(arc(Math.PI));
  const c = (f0 + f2) / 2;
  return [(f0 - f2) / 2, f1 - c, c];
}

/**
 * Follows the load from lift-off to rest. `axes` are the lift points' outward axes; the load turns
 * over when a taut leg would leave its lift point on the inner side, (H - P_i) . a_i <= GEOMETRY_TOL_M.
 */
export function settleFromLiftOff(
  cog: Vec3,
  positions: readonly Vec3[],
  axes: readonly Vec3[],
  lengthsM: readonly number[],
): SettleResult {
  const start = liftOffHook(cog, positions, lengthsM);
  if (start === null) return { kind: "unknown" };
  const n = positions.length;
  let hook = start;
  for (let move = 0; move < MAX_MOVES; move++) {
    const v = normalize(sub(hook, cog));
    if (v === null) return { kind: "unknown" };
    const taut: number[] = [];
    const us: Vec3[] = positions.map((p, i) => {
      const u = normalize(sub(hook, p)) ?? v;
      if (distance(hook, p) >= lengthsM[i]! - TAUT_TOL_M) taut.push(i);
      return u;
    });
    for (const i of taut) {
      // At lift-off every taut leg must rise from its lift point; a leg that becomes taut on the inner
      // side later means the load has turned over.
      if (!(dot(sub(hook, positions[i]!), axes[i]!) > GEOMETRY_TOL_M))
        return move === 0 ? { kind: "unknown" } : { kind: "turns-over", leg: i };
    }
    const proj = projectOnCone(v, us, taut);
    if (proj === null) return { kind: "unknown" };
    const speed = Math.hypot(proj.d.x, proj.d.y, proj.d.z);
    const keep = proj.keep;
    if (speed <= REST_GRADIENT) {
      const free = freeDirection(keep, taut, us);
      if (free === null || isStable(hook, cog, keep, us, v, lengthsM)) return { kind: "rest", hook, carrying: keep };
      // Balanced but unstable (the CoG above a single lift point, or above the line of two): the
      // slightest disturbance starts it swinging; follow it from a nudge along the free direction.
      const nudged = nudge(keep, hook, free, cog, positions, lengthsM);
      if (nudged === null) return { kind: "unknown" };
      hook = nudged;
      continue;
    }
    if (keep.length === 0) {
      // Every leg slack: H moves straight away from G until a leg goes taut.
      let s = Infinity;
      for (let k = 0; k < n; k++) {
        const r = sub(hook, positions[k]!);
        const b = dot(v, r);
        const c = dot(r, r) - lengthsM[k]! * lengthsM[k]!;
        const exit = -b + Math.sqrt(Math.max(0, b * b - c));
        if (exit > EPS_MOVE) s = Math.min(s, exit);
      }
      if (!Number.isFinite(s)) return { kind: "unknown" };
      hook = { x: hook.x + s * v.x, y: hook.y + s * v.y, z: hook.z + s * v.z };
      continue;
    }
    const arc = arcFor(keep, hook, proj.d, cog, positions, lengthsM);
    if (arc === null) return { kind: "unknown" };
    let t = arc.end;
    let overLeg = -1;
    const events: Array<{ f: (h: Vec3) => number; overLeg?: number }> = [];
    for (let k = 0; k < n; k++) {
      if (keep.includes(k)) continue;
      const pk = positions[k]!;
      const lk2 = lengthsM[k]! * lengthsM[k]!;
      events.push({ f: (h) => lk2 - dot(sub(h, pk), sub(h, pk)) });
    }
    for (const i of keep) {
      const pi = positions[i]!;
      const ai = axes[i]!;
      events.push({ f: (h) => dot(sub(h, pi), ai) - GEOMETRY_TOL_M, overLeg: i });
    }
    events.push(...slackEvents(keep, cog, positions, lengthsM, us));
    for (const e of events) {
      const [a, b, c] = sinusoid(e.f, arc.at);
      const te = firstDrop(a, b, c, arc.end);
      if (te < t || (te === t && e.overLeg !== undefined)) {
        t = te;
        overLeg = e.overLeg ?? -1;
      }
    }
    if (overLeg >= 0) return { kind: "turns-over", leg: overLeg };
    hook = arc.at(t);
  }
  return { kind: "unknown" };
}

/**
 * Second-order test at a balanced point: with the carrying legs' multipliers mu (v = sum mu_i u_i),
 * moving along a free direction of 1 or 2 taut legs changes |H - G| by
 * |t|^2 (1/|H - G| - sum mu_i / L_i) / 2: a stable rest needs sum mu_i / L_i >= 1/|H - G|
 * (equality, to GEOMETRY_TOL_M, is neutral and accepted as in level mode).
 */
function isStable(
  hook: Vec3,
  cog: Vec3,
  keep: readonly number[],
  us: readonly Vec3[],
  v: Vec3,
  lengthsM: readonly number[],
): boolean {
  if (keep.length >= 3) return true;
  const mu = multipliers(
    v,
    keep.map((i) => us[i]!),
  );
  if (mu === null) return false;
  let sigma = 0;
  keep.forEach((i, k) => (sigma += mu[k]! / lengthsM[i]!));
  // 1/sigma is how far below the hook the CoG must hang to be stable; within GEOMETRY_TOL_M counts as neutral.
  return sigma * (distance(hook, cog) + GEOMETRY_TOL_M) >= 1;
}

/**
 * A direction the hook point can move with the carrying legs (keep) still taut and no other taut leg
 * stretched: t . u_i = 0 for i in keep, t . u_k <= 0 for the other taut legs; null when there is none
 * (three carrying legs, or the other taut legs block every way).
 */
function freeDirection(keep: readonly number[], taut: readonly number[], us: readonly Vec3[]): Vec3 | null {
  const others = taut.filter((k) => !keep.includes(k));
  const allowed = (t: Vec3): boolean => others.every((k) => dot(t, us[k]!) <= 1e-12);
  const tries: Vec3[] = [];
  if (keep.length === 2) {
    const c = normalize(cross(us[keep[0]!]!, us[keep[1]!]!));
    if (c !== null) tries.push(c, { x: -c.x, y: -c.y, z: -c.z });
  } else if (keep.length === 1) {
    // In the tangent plane of the one taut leg: downhill first, then the edges the other legs allow.
    const u = us[keep[0]!]!;
    const inPlane = (w: Vec3): Vec3 | null =>
      normalize({ x: w.x - dot(w, u) * u.x, y: w.y - dot(w, u) * u.y, z: w.z - dot(w, u) * u.z }, 1e-9);
    for (const w of [
      { x: 0, y: 0, z: -1 },
      { x: 1, y: 0, z: 0 },
      { x: 0, y: 1, z: 0 },
    ]) {
      const t = inPlane(w);
      if (t !== null) tries.push(t, { x: -t.x, y: -t.y, z: -t.z });
    }
    for (const k of others) {
      const e = normalize(cross(u, us[k]!));
      if (e !== null) tries.push(e, { x: -e.x, y: -e.y, z: -e.z });
    }
  }
  return tries.find(allowed) ?? null;
}

/** A point a hair along direction t on the taut legs' sphere or circle, or null. */
function nudge(
  keep: readonly number[],
  hook: Vec3,
  t: Vec3,
  cog: Vec3,
  positions: readonly Vec3[],
  lengthsM: readonly number[],
): Vec3 | null {
  const arc = arcFor(keep, hook, t, cog, positions, lengthsM);
  return arc === null ? null : arc.at(Math.min(1e-7, arc.end / 2));
}

interface Arc {
  at: (t: number) => Vec3;
  /** Angle at which the arc reaches its point farthest from G. */
  end: number;
}

/** The arc H moves along while the legs in keep (1 or 2) stay taut, starting at hook in direction d. */
function arcFor(
  keep: readonly number[],
  hook: Vec3,
  d: Vec3,
  cog: Vec3,
  positions: readonly Vec3[],
  lengthsM: readonly number[],
): Arc | null {
  let centre: Vec3;
  let radius: number;
  let toward: Vec3 | null;
  if (keep.length === 1) {
    // A meridian of the leg's sphere, toward its point farthest from G.
    centre = positions[keep[0]!]!;
    radius = lengthsM[keep[0]!]!;
    toward = normalize(sub(centre, cog));
  } else if (keep.length === 2) {
    // The circle where two legs' spheres meet, toward its point farthest from G.
    const pi = positions[keep[0]!]!;
    const pj = positions[keep[1]!]!;
    const dij = distance(pi, pj);
    const axis = normalize(sub(pj, pi));
    if (axis === null) return null;
    const li = lengthsM[keep[0]!]!;
    const lj = lengthsM[keep[1]!]!;
    const along = (li * li - lj * lj + dij * dij) / (2 * dij);
    centre = { x: pi.x + along * axis.x, y: pi.y + along * axis.y, z: pi.z + along * axis.z };
    radius = distance(hook, centre);
    const gc = sub(cog, centre);
    const g = dot(gc, axis);
    toward = normalize({ x: -(gc.x - g * axis.x), y: -(gc.y - g * axis.y), z: -(gc.z - g * axis.z) }, GEOMETRY_TOL_M);
  } else {
    return null;
  }
  const e1 = normalize(sub(hook, centre));
  const e2 = normalize(sub(d, scaled(e1 ?? d, dot(d, e1 ?? d))));
  if (e1 === null || e2 === null || toward === null || !(radius > 0)) return null;
  let end = Math.atan2(dot(toward, e2), dot(toward, e1));
  // Starting from the point nearest G, the farthest point is half a turn away either way.
  if (end < -Math.PI + 1e-6) end += 2 * Math.PI;
  if (!(end > EPS_MOVE)) return null;
  return {
    at: (t) => {
      const c = Math.cos(t) * radius;
      const s = Math.sin(t) * radius;
      return {
        x: centre.x + c * e1.x + s * e2.x,
        y: centre.y + c * e1.y + s * e2.y,
        z: centre.z + c * e1.z + s * e2.z,
      };
    },
    end,
  };
}

function scaled(a: Vec3, s: number): Vec3 {
  return { x: a.x * s, y: a.y * s, z: a.z * s };
}

/**
 * A kept leg going slack: its multiplier changes sign. One leg: (H - G) . (H - P_i). Two legs:
 * (H - G) . (u_i - c u_j), c = u_i . u_j (fixed on their circle).
 */
function slackEvents(
  keep: readonly number[],
  cog: Vec3,
  positions: readonly Vec3[],
  lengthsM: readonly number[],
  us: readonly Vec3[],
): Array<{ f: (h: Vec3) => number }> {
  if (keep.length === 1) {
    const p = positions[keep[0]!]!;
    return [{ f: (h) => dot(sub(h, cog), sub(h, p)) }];
  }
  const [i, j] = keep as [number, number];
  const c = dot(us[i]!, us[j]!);
  const pi = positions[i]!;
  const pj = positions[j]!;
  const li = lengthsM[i]!;
  const lj = lengthsM[j]!;
  const sign = (p: Vec3, l: number, q: Vec3, m: number) => (h: Vec3) => {
    const hg = sub(h, cog);
    return dot(hg, sub(h, p)) / l - (c * dot(hg, sub(h, q))) / m;
  };
  return [{ f: sign(pi, li, pj, lj) }, { f: sign(pj, lj, pi, li) }];
}
