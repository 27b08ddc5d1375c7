// The load's tilt in its own planes, the leg changes that would level it, and the check of the tilt
// against the component's fit tolerance.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { handleSolve } from "./api";
import { solveGivenLengths, solveLevel, type BridleLoad, type LiftPoint } from "./bridle";
import { checkFitTilt, DEFAULT_FIT_TOLERANCE_DEG, levellingLengths, planeTilts } from "./tilt";
import { distance } from "./vector";

const RUNS = Number(process.env.STATICS_LAW_RUNS ?? 300);
const UP = { x: 0, y: 0, z: 1 };
const DEG = 180 / Math.PI;
const lp = (id: string, x: number, y: number, z: number): LiftPoint => ({ id, position: { x, y, z }, axis: UP });
const coord = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

/** Sling lengths that put the hook at G + d * (a, b, 1) / |(a, b, 1)|: the load then hangs with exactly that vertical. */
function lengthsForHook(load: BridleLoad, points: LiftPoint[], a: number, b: number, d: number) {
  const n = Math.hypot(a, b, 1);
  const hook = { x: load.cog.x + (d * a) / n, y: load.cog.y + (d * b) / n, z: load.cog.z + d / n };
  return points.map((p) => distance(hook, p.position));
}

describe("tilt in each of the component's planes (hand-computed geometry; DEVELOPERS.md model)", () => {
  it("a vertical leaning only along x tilts the load only along its length", () => {
    const t = planeTilts({ x: Math.sin(10 / DEG), y: 0, z: Math.cos(10 / DEG) });
    expect(t.alongLengthDeg).toBeCloseTo(10, 12);
    expect(t.acrossWidthDeg).toBe(0);
  });
  it("a single leg at (0.3, 0.2, 1) m over a CoG at the origin: atan 0.3 = 16.699 deg along, atan 0.2 = 11.310 deg across", () => {
    const r = solveGivenLengths({ massKg: 500, cog: { x: 0, y: 0, z: 0 } }, [lp("A", 0.3, 0.2, 1)], [0.5]);
    if (!r.ok) throw new Error(r.message);
    const t = planeTilts(r.solution.vertical);
    expect(t.alongLengthDeg).toBeCloseTo(Math.atan(0.3) * DEG, 9); // 16.6992 deg
    expect(t.acrossWidthDeg).toBeCloseTo(Math.atan(0.2) * DEG, 9); // 11.3099 deg
    // Each plane on its own is less than the whole tilt: acos(1 / sqrt(1.13)) = 19.80 deg.
    expect(r.solution.tiltDeg).toBeCloseTo(Math.acos(1 / Math.sqrt(1.13)) * DEG, 9);
  });
  it("three slings cut to hang the hook at G + (0.05, -0.03, 1) settle there: atan 0.05 along, atan -0.03 across", () => {
    const load = { massKg: 2000, cog: { x: 0.1, y: 0, z: 0.2 } };
    const points = [lp("A", -0.8, -0.5, 0.6), lp("B", 0.9, -0.4, 0.6), lp("C", 0.1, 0.7, 0.6)];
    const r = solveGivenLengths(load, points, lengthsForHook(load, points, 0.05, -0.03, 1.8));
    if (!r.ok) throw new Error(r.message);
    const t = planeTilts(r.solution.vertical);
    expect(t.alongLengthDeg).toBeCloseTo(Math.atan(0.05) * DEG, 6); // 2.862 deg: +x end raised
    expect(t.acrossWidthDeg).toBeCloseTo(Math.atan(-0.03) * DEG, 6); // -1.718 deg: +y side lowered
  });
});

describe("the leg changes that would hang the load level", () => {
  it("two legs 1 m either side, slings 1.30 m and 1.25 m: shorten A to B's level length (hand-computed)", () => {
    const load = { massKg: 1000, cog: { x: 0, y: 0, z: -0.3 } };
    const points = [lp("A", -1, 0, 0), lp("B", 1, 0, 0)];
    const l = levellingLengths(load, points, [1.3, 1.25]);
    if (!l.ok) throw new Error(l.reason);
    // B binds: hook at sqrt(1.25^2 - 1) = 0.75 m, so both legs are 1.25 m and A shortens by 50 mm.
    expect(l.hookZM).toBeCloseTo(0.75, 12);
    expect(l.legs.map((x) => x.changeM)).toEqual([expect.closeTo(-0.05, 12), expect.closeTo(0, 12)]);
  });
  it("law: applying the changes gives no tilt, keeps one leg as it is and never lengthens a leg that reaches", () => {
    fc.assert(
      fc.property(
        fc.record({
          gx: coord(-2, 2),
          gy: coord(-2, 2),
          base: coord(0, 2 * Math.PI),
          jitter: fc.array(coord(-0.3, 0.3), { minLength: 3, maxLength: 3 }),
          radii: fc.array(coord(0.3, 2), { minLength: 3, maxLength: 3 }),
          dz: fc.array(coord(0.1, 1), { minLength: 3, maxLength: 3 }),
          rise: coord(0.8, 3),
          perturb: fc.array(coord(-0.05, 0.05), { minLength: 3, maxLength: 3 }),
        }),
        (r) => {
          const load = { massKg: 1500, cog: { x: r.gx, y: r.gy, z: 0 } };
          const points = [0, 1, 2].map((i) => {
            const phi = r.base + (i * 2 * Math.PI) / 3 + r.jitter[i]! * (Math.PI / 3);
            return lp("ABC"[i]!, r.gx + r.radii[i]! * Math.cos(phi), r.gy + r.radii[i]! * Math.sin(phi), r.dz[i]!);
          });
          const level = solveLevel(load, points, Math.max(...r.dz) + r.rise);
          fc.pre(level.ok && level.solution.legs.every((l) => l.angleFromVerticalDeg <= 60));
          if (!level.ok) return;
          const given = level.solution.legs.map((l, i) => l.lengthM * (1 + r.perturb[i]!));
          const tilted = solveGivenLengths(load, points, given);
          fc.pre(tilted.ok);
          const l = levellingLengths(load, points, given);
          if (!l.ok) throw new Error(l.reason);
          const changed = given.map((g, i) => g + l.legs[i]!.changeM);
          const after = solveGivenLengths(load, points, changed);
          if (!after.ok) throw new Error(after.message);
          expect(after.solution.tiltDeg).toBeLessThan(1e-6);
          const t = planeTilts(after.solution.vertical);
          expect(Math.abs(t.alongLengthDeg)).toBeLessThan(1e-6);
          expect(Math.abs(t.acrossWidthDeg)).toBeLessThan(1e-6);
          expect(Math.min(...l.legs.map((x) => Math.abs(x.changeM)))).toBeLessThan(1e-9);
          for (const x of l.legs) expect(x.changeM).toBeLessThanOrEqual(1e-9);
        },
      ),
      { numRuns: RUNS },
    );
  });
  it("a two-leg load whose CoG is off the line of its lift points cannot hang level: no levelling", () => {
    const load = { massKg: 1000, cog: { x: 0, y: 0.2, z: -0.3 } };
    const l = levellingLengths(load, [lp("A", -1, 0, 0), lp("B", 1, 0, 0)], [1.3, 1.3]);
    expect(l.ok).toBe(false);
  });
});

describe("the tilt against the component's fit tolerance (common practice where none is recorded)", () => {
  const load = { massKg: 1000, cog: { x: 0, y: 0, z: -0.3 } };
  const points = [lp("A", -1, 0, 0), lp("B", 1, 0, 0)];
  const settle = (lengths: number[]) => {
    const r = solveGivenLengths(load, points, lengths);
    if (!r.ok) throw new Error(r.message);
    return { solution: r.solution, levelling: levellingLengths(load, points, lengths) };
  };

  it("slings 50 mm apart tilt the load past a 1 deg tolerance: it fails, unrounded, with shorten leg A by 50 mm", () => {
    const { solution, levelling } = settle([1.3, 1.25]);
    const c = checkFitTilt(solution, { toleranceDeg: 1, source: "Gearbox drawing GB-220 note 4" }, levelling);
    const along = Math.abs(planeTilts(solution.vertical).alongLengthDeg);
    expect(along).toBeGreaterThan(1);
    expect(c.verdict).toBe("fail");
    expect(c.finding).toBe("tilt-over");
    expect(c.utilisation).toBe(along / 1);
    expect(c.source).toContain("Gearbox drawing GB-220 note 4");
    expect(c.inputs.tilt?.toleranceFrom).toBe("component");
    expect(c.fix).toEqual({ kind: "level-legs", legs: [{ legId: "A", changeM: expect.closeTo(-0.05, 9) }] });
  });
  it("the same tilt passes a tolerance larger than it", () => {
    const { solution, levelling } = settle([1.3, 1.25]);
    const along = Math.abs(planeTilts(solution.vertical).alongLengthDeg);
    const c = checkFitTilt(solution, { toleranceDeg: along * 1.01 }, levelling);
    expect(c.verdict).toBe("pass");
    expect(c.utilisation).toBeCloseTo(1 / 1.01, 12);
    expect(c.fix).toBeNull();
  });
  it("with no tolerance recorded it uses the common-practice default and says so", () => {
    const { solution, levelling } = settle([1.3, 1.3]);
    const c = checkFitTilt(solution, { toleranceDeg: null }, levelling);
    expect(c.inputs.tilt?.toleranceDeg).toBe(DEFAULT_FIT_TOLERANCE_DEG);
    expect(c.inputs.tilt?.toleranceFrom).toBe("common-practice");
    expect(c.source).toMatch(/common practice/);
    expect(c.verdict).toBe("pass");
    expect(c.utilisation).toBeLessThan(1e-9);
  });
  it("a level lift hangs level by design: 0 tilt passes", () => {
    const r = solveLevel(load, points, 1);
    if (!r.ok) throw new Error(r.message);
    const c = checkFitTilt(r.solution, { toleranceDeg: 0.5 }, null);
    expect(c.verdict).toBe("pass");
    expect(c.utilisation).toBe(0);
  });
  it("/api/solve adds the check when the body gives the fit, and reports the levelling and plane tilts", () => {
    const body = {
      load,
      liftPoints: points.map((p) => ({ id: p.id, ...p.position })),
      legLengths: { A: 1.3, B: 1.25 },
      fit: { toleranceDeg: 1, source: "drawing" },
    };
    const res = handleSolve(body, REFERENCE_TABLES);
    if (res.status !== 200) throw new Error(JSON.stringify(res.body));
    const fit = res.body.checks?.find((c) => c.id === "fit-tilt");
    expect(fit?.verdict).toBe("fail");
    expect(fit?.message).toMatch(/shorten leg A by 50 mm/);
    expect(res.body.levelling?.legs.map((l) => l.liftPointId)).toEqual(["A", "B"]);
    expect(Math.abs(res.body.tiltPlanes!.alongLengthDeg)).toBeCloseTo(res.body.tiltDeg, 9);
    const without = handleSolve({ ...body, fit: undefined }, REFERENCE_TABLES);
    if (without.status !== 200) throw new Error("solve failed");
    expect(without.body.checks?.some((c) => c.id === "fit-tilt")).toBe(false);
  });
  it("/api/solve refuses a fit tolerance of zero or over 45 deg (400)", () => {
    const body = { load, liftPoints: points.map((p) => ({ id: p.id, ...p.position })), hook: { z: 1 } };
    expect(handleSolve({ ...body, fit: { toleranceDeg: 0 } }, REFERENCE_TABLES).status).toBe(400);
    expect(handleSolve({ ...body, fit: { toleranceDeg: 50 } }, REFERENCE_TABLES).status).toBe(400);
  });
});
