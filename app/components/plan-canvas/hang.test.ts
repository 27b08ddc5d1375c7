// The elevation's turn to how the load hangs: the hook ends plumb over the CoG, lengths are kept, and the
// turn undoes exactly (geometry; DEVELOPERS.md model).
import { describe, expect, it } from "vitest";
import { boxOnScreen, hangingFrame } from "~/components/plan-canvas/hang";

const cog = { x: 0.1, y: -0.2, z: 0.3 };
const dist = (a: { x: number; y: number; z: number }, b: typeof a) => Math.hypot(a.x - b.x, a.y - b.y, a.z - b.z);

describe("the load drawn as it hangs", () => {
  it("a hook 10 deg off the CoG's plumb line along x: the +x end drawn raised by L sin 10 deg, the hook plumb over the CoG", () => {
    const t = (10 * Math.PI) / 180;
    const hook = { x: cog.x + 2 * Math.sin(t), y: cog.y, z: cog.z + 2 * Math.cos(t) };
    const f = hangingFrame(cog, hook);
    expect(f.tilted).toBe(true);
    const h = f.toWorld(hook);
    expect(h.x).toBeCloseTo(cog.x, 12);
    expect(h.y).toBeCloseTo(cog.y, 12);
    expect(h.z).toBeCloseTo(cog.z + 2, 12);
    // A point 1 m along +x from the CoG rises by sin 10 deg = 0.17365 m.
    const end = f.toWorld({ x: cog.x + 1, y: cog.y, z: cog.z });
    expect(end.z - cog.z).toBeCloseTo(Math.sin(t), 12);
  });
  it("keeps distances and undoes exactly, for a compound tilt", () => {
    const hook = { x: cog.x + 0.3, y: cog.y - 0.2, z: cog.z + 1.5 };
    const f = hangingFrame(cog, hook);
    const p = { x: 1, y: 0.5, z: -0.4 };
    const q = { x: -0.7, y: 0.2, z: 0.9 };
    expect(dist(f.toWorld(p), f.toWorld(q))).toBeCloseTo(dist(p, q), 12);
    const back = f.toComponent(f.toWorld(p));
    expect(back.x).toBeCloseTo(p.x, 12);
    expect(back.y).toBeCloseTo(p.y, 12);
    expect(back.z).toBeCloseTo(p.z, 12);
  });
  it("a level hang, or no hook yet, is drawn as set", () => {
    expect(hangingFrame(cog, { ...cog, z: 2 }).tilted).toBe(false);
    expect(hangingFrame(cog, null).tilted).toBe(false);
  });
  it("a box is on screen only when every edge is inside", () => {
    const t = { scalePxPerM: 100, originX: 200, originY: 200 };
    expect(boxOnScreen(t, { minA: -1, maxA: 1, minB: -1, maxB: 1 }, 400, 400)).toBe(true);
    expect(boxOnScreen(t, { minA: -1, maxA: 1, minB: -1, maxB: 2.5 }, 400, 400)).toBe(false);
  });
});
