// Given-lengths mode: the load settles with the hook on the side the legs leave from (above the
// lift points), whatever the height of the CoG, and a load with no stable position there is refused.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { solveGivenLengths, solveLevel, type BridleLoad, type LiftPoint } from "./bridle";
import { distance, dot, sub } from "./vector";

const RUNS = Number(process.env.STATICS_LAW_RUNS ?? 300);
const UP = { x: 0, y: 0, z: 1 };
const lp = (id: string, x: number, y: number, z: number): LiftPoint => ({ id, position: { x, y, z }, axis: UP });
const at = (x: number, y: number, z: number, massKg = 1000): BridleLoad => ({ massKg, cog: { x, y, z } });
const coord = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

interface Rig {
  load: BridleLoad;
  points: LiftPoint[];
  hookZ: number;
}

type CogHeight = "below" | "above" | "mixed";

/**
 * Lift points spread around the CoG's plumb line (every angular gap under 180 deg, so the plumb
 * point is inside their hull); the CoG below every point, above every point, or between; the hook
 * high enough that no leg is more than 59 deg from vertical (a plan may use up to 60 deg, EN 818-6
 * practice).
 */
function arbRig(legs: 1 | 2 | 3 | 4, height: CogHeight): fc.Arbitrary<Rig> {
  const dz = height === "below" ? coord(0.05, 1.5) : height === "above" ? coord(-1.5, -0.05) : coord(-1.5, 1.5);
  return fc
    .record({
      gx: coord(-5, 5),
      gy: coord(-5, 5),
      gz: coord(-5, 5),
      massKg: coord(1, 50000),
      base: coord(0, 2 * Math.PI),
      jitter: fc.array(coord(-0.3, 0.3), { minLength: legs, maxLength: legs }),
      radii: fc.array(coord(0.2, 2.5), { minLength: legs, maxLength: legs }),
      dz: fc.array(dz, { minLength: legs, maxLength: legs }),
      rise: coord(0.6, 3),
    })
    .map((r) => {
      const g = { x: r.gx, y: r.gy, z: r.gz };
      const points: LiftPoint[] = [];
      for (let i = 0; i < legs; i++) {
        const phi =
          legs <= 2 ? r.base + i * Math.PI : r.base + (i * 2 * Math.PI) / legs + r.jitter[i]! * (Math.PI / legs);
        const rad = legs === 1 ? 0 : r.radii[i]!;
        points.push({
          id: String.fromCharCode(65 + i),
          position: { x: g.x + rad * Math.cos(phi), y: g.y + rad * Math.sin(phi), z: g.z + r.dz[i]! },
          axis: UP,
        });
      }
      const top = Math.max(g.z, ...points.map((p) => p.position.z));
      const reach = Math.max(0.2, ...r.radii);
      return { load: { massKg: r.massKg, cog: g }, points, hookZ: top + r.rise * reach };
    });
}

const heights: CogHeight[] = ["below", "above", "mixed"];

describe("round trip level -> given lengths, CoG below, above or among the lift points (0 tilt, same tensions)", () => {
  it.each([
    [3, "below"],
    [3, "above"],
    [3, "mixed"],
    [4, "below"],
    [4, "above"],
    [4, "mixed"],
    [2, "below"],
    [2, "mixed"],
  ] as Array<[2 | 3 | 4, CogHeight]>)("%d legs, CoG %s the lift points", (legs, height) => {
    fc.assert(
      fc.property(arbRig(legs, height), (c) => {
        const level = solveLevel(c.load, c.points, c.hookZ);
        if (!level.ok) {
          // Two legs with the CoG above the line through them cannot hang level. On the same slings the load
          // turns over: refused with the same code, or (when the CoG is below one lift point) found hanging
          // from that leg well away from level, never back at level.
          expect(legs).toBe(2);
          expect(level.code).toBe("COG_ABOVE_LIFT_LINE");
          const hook = { x: c.load.cog.x, y: c.load.cog.y, z: c.hookZ };
          const r = solveGivenLengths(
            c.load,
            c.points,
            c.points.map((p) => distance(hook, p.position)),
          );
          if (r.ok) {
            expect(r.solution.tiltDeg).toBeGreaterThan(1);
            expect(r.solution.warnings.map((w) => w.code)).toContain("LOAD_TILTS");
          } else {
            expect(r.code).toBe("COG_ABOVE_LIFT_LINE");
          }
          return;
        }
        for (const leg of level.solution.legs) expect(leg.angleFromVerticalDeg).toBeLessThanOrEqual(60);
        const r = solveGivenLengths(
          c.load,
          c.points,
          level.solution.legs.map((l) => l.lengthM),
        );
        if (!r.ok) throw new Error(`${r.code}: ${r.message}`);
        const s = r.solution;
        expect(s.tiltDeg).toBeLessThanOrEqual(1e-6);
        expect(distance(s.hook, level.solution.hook)).toBeLessThanOrEqual(1e-6);
        const w = level.solution.weightKn;
        level.solution.legs.forEach((leg, i) => {
          expect(Math.abs(s.legs[i]!.tensionKn - leg.tensionKn)).toBeLessThanOrEqual(1e-7 * w);
          expect(s.legs[i]!.slack).toBe(leg.slack);
          expect(
            Math.abs(s.rating.legs[i]!.designTensionKn - level.solution.rating.legs[i]!.designTensionKn),
          ).toBeLessThanOrEqual(1e-7 * w);
        });
        expect(s.method).toBe(level.solution.method);
      }),
      { numRuns: RUNS },
    );
  });
  it("the 3-leg rig with its CoG 0.3 m above the lift points hangs level again (hook 2 m above them; lengths derived from it)", () => {
    // Lengths are |H - P_i| for H = (0.1, 0, 2.0): sqrt(0.9^2 + 2^2) = 2.19317... and sqrt(0.6^2 + 0.8660254^2 + 2^2) (geometry).
    const points = [lp("A", 1, 0, 0), lp("B", -0.5, 0.8660254, 0), lp("C", -0.5, -0.8660254, 0)];
    const r = solveGivenLengths(at(0.1, 0, 0.3), points, [2.193171219946131, 2.260530911091463, 2.2605309110914633]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.solution.tiltDeg).toBeLessThan(1e-6);
    expect(r.solution.hook.z).toBeCloseTo(2, 6);
    expect(r.solution.hook.x).toBeCloseTo(0.1, 6);
    const level = solveLevel(at(0.1, 0, 0.3), points, 2);
    expect(level.ok).toBe(true);
    if (!level.ok) return;
    r.solution.legs.forEach((leg, i) => expect(leg.tensionKg).toBeCloseTo(level.solution.legs[i]!.tensionKg, 4));
  });
});

describe("each taut leg leaves its lift point outward along the lift point's axis", () => {
  it("for any sling lengths the hook is on the outward side of every taut leg, or the load is refused", () => {
    fc.assert(
      fc.property(
        fc.constantFrom(1 as const, 2 as const, 3 as const, 4 as const).chain((n) =>
          fc.tuple(
            fc.constantFrom(...heights).chain((h) => arbRig(n, h)),
            fc.array(coord(0.7, 1.6), { minLength: n, maxLength: n }),
          ),
        ),
        ([c, scale]) => {
          const hook = { x: c.load.cog.x, y: c.load.cog.y, z: c.hookZ };
          const lengths = c.points.map((p, i) => distance(hook, p.position) * scale[i]!);
          const r = solveGivenLengths(c.load, c.points, lengths);
          if (!r.ok) {
            expect([
              "COG_ABOVE_LIFT_POINT",
              "COG_ABOVE_LIFT_LINE",
              "LOAD_TURNS_OVER",
              "LEGS_CANNOT_MEET",
              "LEGS_NEARLY_STRAIGHT",
            ]).toContain(r.code);
            expect(r.message).toMatch(/[a-z].*\.$/);
            return;
          }
          const s = r.solution;
          s.legs.forEach((leg, i) => {
            if (leg.slack) return;
            const p = c.points[i]!;
            expect(dot(sub(s.hook, p.position), p.axis)).toBeGreaterThan(0);
            expect(leg.tensionKn).toBeGreaterThanOrEqual(0);
          });
          // The CoG hangs plumb below the hook.
          expect(dot(sub(s.hook, c.load.cog), s.vertical)).toBeGreaterThan(0);
        },
      ),
      { numRuns: RUNS },
    );
  });
});

describe("a load with no stable position on the outward side turns over: refused like level mode", () => {
  it("1 leg with the CoG above the lift point -> COG_ABOVE_LIFT_POINT (common practice: lift from above the CoG)", () => {
    const r = solveGivenLengths(at(0, 0, 0.3), [lp("A", 0, 0, 0)], [1]);
    expect(!r.ok && r.code).toBe("COG_ABOVE_LIFT_POINT");
    expect(!r.ok && r.message).toMatch(/turn over/);
    expect(solveLevel(at(0, 0, 0.3), [lp("A", 0, 0, 0)], 1).ok).toBe(false);
  });
  it("1 leg slightly off the plumb line with the CoG above: turns over, not reported hanging inverted", () => {
    const r = solveGivenLengths(at(0.05, 0, 0.3), [lp("A", 0, 0, 0)], [1]);
    expect(!r.ok && r.code).toBe("COG_ABOVE_LIFT_POINT");
  });
  it("2 legs with the CoG above the line through the lift points -> COG_ABOVE_LIFT_LINE, as in level mode", () => {
    const points = [lp("A", -1, 0, 0), lp("B", 1, 0, 0)];
    const level = solveLevel(at(0, 0, 0.3), points, 1);
    expect(!level.ok && level.code).toBe("COG_ABOVE_LIFT_LINE");
    const r = solveGivenLengths(at(0, 0, 0.3), points, [Math.SQRT2, Math.SQRT2]);
    expect(!r.ok && r.code).toBe("COG_ABOVE_LIFT_LINE");
    expect(!r.ok && r.message).toMatch(/turn over/);
  });
  it("2 legs with the CoG below the line still hang (the same slings, CoG 0.3 m lower)", () => {
    const r = solveGivenLengths(at(0, 0, -0.3), [lp("A", -1, 0, 0), lp("B", 1, 0, 0)], [Math.SQRT2, Math.SQRT2]);
    expect(r.ok && r.solution.tiltDeg).toBeCloseTo(0, 9);
    expect(r.ok && r.solution.hook.z).toBeCloseTo(1, 9);
  });
  it("3 legs, CoG 0.3 m above them, one sling long: the two short legs would push, so it turns over -> LOAD_TURNS_OVER", () => {
    // Legs A, B (1.5 m) meet on a circle of radius sqrt(1.5^2 - 1) about the midpoint of A-B; with C's 2 m sling
    // the highest equilibrium on that circle needs A and B to push (statics, worked by hand), and C alone hangs
    // the CoG above C. With C's sling 1.5 m all three are taut and the load hangs tilted (about 20 deg).
    const points = [lp("A", -1, 0, 0), lp("B", 1, 0, 0), lp("C", 0, 1, 0)];
    const r = solveGivenLengths(at(0, 0.3, 0.3), points, [1.5, 1.5, 2]);
    expect(!r.ok && r.code).toBe("LOAD_TURNS_OVER");
    expect(!r.ok && r.message).toMatch(/turn over/);
    const ok = solveGivenLengths(at(0, 0.3, 0.3), points, [1.5, 1.5, 1.5]);
    expect(ok.ok).toBe(true);
    if (!ok.ok) return;
    expect(ok.solution.hook.z).toBeGreaterThan(0);
    expect(ok.solution.legs.every((l) => !l.slack)).toBe(true);
    expect(ok.solution.tiltDeg).toBeGreaterThan(10);
  });
});
