// The load as it hangs: on slings of given lengths the hook settles plumb over the CoG and the load tilts.
// The elevation draws the component turned by the rotation that takes its "up as it hangs" (hook minus
// CoG) onto the true vertical, about the CoG; level lifts are drawn as they are. Pure.
import type { Vec3 } from "~/plans/editor-state";

export type HangFrame = {
  /** Whether the drawing is turned at all. */
  tilted: boolean;
  /** A component-frame point where it hangs (the same frame, turned about the CoG), m. */
  toWorld: (p: Vec3) => Vec3;
  /** The inverse: a point where it hangs back to the component frame, m. */
  toComponent: (p: Vec3) => Vec3;
};

const IDENTITY: HangFrame = { tilted: false, toWorld: (p) => p, toComponent: (p) => p };

/** Rodrigues: p turned by angle (cos c, sin s) about the unit axis k. */
function turn(p: Vec3, k: Vec3, c: number, s: number): Vec3 {
  const kxp = { x: k.y * p.z - k.z * p.y, y: k.z * p.x - k.x * p.z, z: k.x * p.y - k.y * p.x };
  const kp = k.x * p.x + k.y * p.y + k.z * p.z;
  return {
    x: p.x * c + kxp.x * s + k.x * kp * (1 - c),
    y: p.y * c + kxp.y * s + k.y * kp * (1 - c),
    z: p.z * c + kxp.z * s + k.z * kp * (1 - c),
  };
}

/** The frame the load hangs in, from the solved hook and the CoG (component frame); identity when level or unknown. */
export function hangingFrame(cog: Vec3, hook: Vec3 | null): HangFrame {
  if (!hook) return IDENTITY;
  const d = { x: hook.x - cog.x, y: hook.y - cog.y, z: hook.z - cog.z };
  const len = Math.hypot(d.x, d.y, d.z);
  if (!(len > 1e-9) || !(d.z > 0)) return IDENTITY;
  const v = { x: d.x / len, y: d.y / len, z: d.z / len };
  // Axis v x z, angle acos(v . z): the smallest turn that stands v upright.
  const axis = { x: v.y, y: -v.x, z: 0 };
  const s = Math.hypot(axis.x, axis.y);
  if (s < 1e-12) return IDENTITY;
  const k = { x: axis.x / s, y: axis.y / s, z: 0 };
  const c = v.z;
  const about = (p: Vec3, sign: 1 | -1) => {
    const r = turn({ x: p.x - cog.x, y: p.y - cog.y, z: p.z - cog.z }, k, c, sign * s);
    return { x: r.x + cog.x, y: r.y + cog.y, z: r.z + cog.z };
  };
  return { tilted: true, toWorld: (p) => about(p, 1), toComponent: (p) => about(p, -1) };
}

/** Whether the box (view axes, m) lies on screen under the transform, at least marginPx inside every edge. */
export function boxOnScreen(
  transform: { scalePxPerM: number; originX: number; originY: number },
  box: { minA: number; maxA: number; minB: number; maxB: number },
  width: number,
  height: number,
  marginPx = 8,
): boolean {
  const left = transform.originX + box.minA * transform.scalePxPerM;
  const right = transform.originX + box.maxA * transform.scalePxPerM;
  const top = transform.originY - box.maxB * transform.scalePxPerM;
  const bottom = transform.originY - box.minB * transform.scalePxPerM;
  return left >= marginPx && right <= width - marginPx && top >= marginPx && bottom <= height - marginPx;
}
