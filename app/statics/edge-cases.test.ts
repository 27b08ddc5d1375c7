// Edge-case table: geometry that cannot hang as asked is refused with a code and a sentence;
// extreme but valid input still solves.
import { describe, expect, it } from "vitest";
import { solveBeamDrops, solveBeamLift } from "./beam";
import { solveGivenLengths, solveLevel, type BridleLoad, type LiftPoint, type SolveOutcome } from "./bridle";

const UP = { x: 0, y: 0, z: 1 };
function lp(id: string, x: number, y: number, z: number): LiftPoint {
  return { id, position: { x, y, z }, axis: UP };
}
const at = (x: number, y: number, z: number, massKg = 1000): BridleLoad => ({ massKg, cog: { x, y, z } });

interface Row {
  name: string;
  run: () => SolveOutcome;
  code: string;
}

const refused: Row[] = [
  {
    name: "three lift points in line in plan",
    run: () => solveLevel(at(0, 0, -0.5), [lp("A", -1, 0, 0), lp("B", 0.2, 0, 0), lp("C", 1, 0, 0)], 1),
    code: "DEGENERATE_LIFT_POINTS",
  },
  {
    name: "hook at CoG height",
    run: () => solveLevel(at(0, 0, 0.5), [lp("A", -1, 0, 0), lp("B", 1, 0, 0)], 0.5),
    code: "HOOK_NOT_ABOVE_COG",
  },
  {
    name: "hook below the CoG",
    run: () => solveLevel(at(0, 0, 0.5), [lp("A", -1, 0, 0), lp("B", 1, 0, 0)], 0.2),
    code: "HOOK_NOT_ABOVE_COG",
  },
  {
    name: "single leg off the plumb line",
    run: () => solveLevel(at(0, 0, -0.5), [lp("A", 0.05, 0, 0)], 1),
    code: "NOT_ON_PLUMB_LINE",
  },
  {
    name: "single leg below the CoG",
    run: () => solveLevel(at(0, 0, 0.5), [lp("A", 0, 0, 0)], 1),
    code: "COG_ABOVE_LIFT_POINT",
  },
  {
    name: "CoG plumb point outside a 3-leg triangle",
    run: () => solveLevel(at(2, 0, -0.5), [lp("A", 0, 0, 0), lp("B", 1, 0, 0), lp("C", 0, 1, 0)], 2),
    code: "COG_OUTSIDE_SUPPORT",
  },
  {
    name: "2 legs, CoG off their vertical plane",
    run: () => solveLevel(at(0, 0.1, -0.3), [lp("A", -1, 0, 0), lp("B", 1, 0, 0)], 1),
    code: "COG_OFF_LEG_PLANE",
  },
  {
    name: "2 legs, CoG not between them in plan",
    run: () => solveLevel(at(1.5, 0, -0.3), [lp("A", -1, 0, 0), lp("B", 1, 0, 0)], 1),
    code: "COG_OUTSIDE_SUPPORT",
  },
  {
    name: "2 legs, CoG above the line through the lift points",
    run: () => solveLevel(at(0, 0, 0.3), [lp("A", -1, 0, 0), lp("B", 1, 0, 0)], 1),
    code: "COG_ABOVE_LIFT_LINE",
  },
  {
    name: "2 lift points one above the other",
    run: () => solveLevel(at(0, 0, -0.3), [lp("A", 0, 0, 0), lp("B", 0, 0, 0.2)], 1),
    code: "DEGENERATE_LIFT_POINTS",
  },
  {
    name: "4 points coplanar with the hook (hook at their level)",
    run: () =>
      solveLevel(at(0, 0, -0.5), [lp("A", -1, -1, 0), lp("B", 1, -1, 0), lp("C", 1, 1, 0), lp("D", -1, 1, 0)], 0),
    code: "HOOK_NOT_ABOVE_LIFT_POINT",
  },
  {
    name: "4 slings so short the hook would sit in the plane of the points",
    run: () =>
      solveGivenLengths(
        at(0, 0, -0.5),
        [lp("A", -1, -1, 0), lp("B", 1, -1, 0), lp("C", 1, 1, 0), lp("D", -1, 1, 0)],
        [Math.SQRT2, Math.SQRT2, Math.SQRT2, Math.SQRT2],
      ),
    code: "LEGS_NEARLY_STRAIGHT",
  },
  {
    name: "zero-length leg in level mode (lift point at the hook)",
    run: () => solveLevel(at(0, 0, -0.5), [lp("A", 0, 0, 1)], 1),
    code: "ZERO_LENGTH_LEG",
  },
  {
    name: "zero-length leg in given-lengths mode",
    run: () => solveGivenLengths(at(0, 0, -0.5), [lp("A", -1, 0, 0), lp("B", 1, 0, 0)], [1.2, 0]),
    code: "ZERO_LENGTH_LEG",
  },
  {
    name: "slings that cannot meet",
    run: () => solveGivenLengths(at(0, 0, -0.5), [lp("A", -1, 0, 0), lp("B", 1, 0, 0)], [0.5, 0.5]),
    code: "LEGS_CANNOT_MEET",
  },
];

describe("refused geometry (422 with a sentence saying what to change)", () => {
  it.each(refused)("$name -> $code", ({ run, code }) => {
    const r = run();
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.code).toBe(code);
    expect(r.message).toMatch(/[a-z].*\.$/);
  });
  it("the off-plane refusal states the roll the load would take (45 deg when the offset equals the height below the lift line)", () => {
    // G 0.1 m off the plane and 0.1 m below the line through the points: rolls atan(0.1/0.1) = 45 deg (geometry).
    const r = solveLevel(at(0, 0.1, -0.1), [lp("A", -1, 0, 0), lp("B", 1, 0, 0)], 1);
    expect(!r.ok && r.message).toContain("45.0 deg");
  });
});

describe("extreme but valid input", () => {
  const points = [lp("A", 0.1, 0, 0), lp("B", 0.8, 0.3, 0), lp("C", 0.1, 0.7, 0)];
  it.each([1e-6, 1, 1e8])("mass %d kg: same shares, finite tensions (linear statics)", (massKg) => {
    const r = solveLevel(at(0.5, 0.4, -0.5, massKg), points, 2);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    for (const leg of r.solution.legs) expect(Number.isFinite(leg.tensionKn)).toBe(true);
    // Vertical shares 5/49, 4/7, 16/49 (mrhengineering.dk three-leg example, derived) at any mass.
    expect(r.solution.legs.map((l) => l.verticalShare)).toEqual([
      expect.closeTo(5 / 49, 12),
      expect.closeTo(4 / 7, 12),
      expect.closeTo(16 / 49, 12),
    ]);
  });
  it("coordinates at 1000 m from the datum solve like the same rig at the origin (translation invariance)", () => {
    const far = solveLevel(
      at(1000.5, 999.4, 999.5),
      points.map((p) => lp(p.id, p.position.x + 1000, p.position.y + 999, 1000)),
      1002,
    );
    const near = solveLevel(at(0.5, 0.4, -0.5), points, 2);
    expect(far.ok && near.ok).toBe(true);
    if (!far.ok || !near.ok) return;
    far.solution.legs.forEach((l, i) => expect(l.tensionKn).toBeCloseTo(near.solution.legs[i]!.tensionKn, 6));
  });
  it("4 legs with the CoG near one corner: the far leg goes slack and 3 carry (elastic share would push)", () => {
    const r = solveLevel(
      at(0.95, 0.95, -0.3),
      [lp("A", -1, -1, 0), lp("B", 1, -1, 0), lp("C", 1, 1, 0), lp("D", -1, 1, 0)],
      1,
    );
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.solution.legs[0]!.slack).toBe(true);
    expect(r.solution.legs[0]!.tensionKn).toBe(0);
    expect(r.solution.warnings.map((w) => w.code)).toContain("LEG_SLACK");
  });
  it("symmetric 4 legs: elastic share W/4 per leg vertically and rated as 3 legs carrying (DGUV Regel 100-500)", () => {
    const r = solveLevel(
      at(0, 0, -0.3),
      [lp("A", -1, -1, 0), lp("B", 1, -1, 0), lp("C", 1, 1, 0), lp("D", -1, 1, 0)],
      Math.SQRT2,
    );
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const s = r.solution;
    expect(s.method).toBe("elastic");
    for (const leg of s.legs) expect(leg.verticalShare).toBeCloseTo(0.25, 12);
    // beta = 45 deg: leg tension W / (4 cos 45); the 3-legs-carry design figure is W / (3 cos 45).
    for (const leg of s.legs) expect(leg.tensionKg).toBeCloseTo(1000 / (4 * Math.SQRT1_2), 9);
    expect(s.rating.symmetric).toBe(true);
    expect(s.rating.effectiveLegs).toBe(3);
    expect(s.rating.designTensionKg).toBeCloseTo(1000 / (3 * Math.SQRT1_2), 9);
  });
  it("asymmetric 4 legs: rated as if 2 legs of a diagonal carry (NAVEDTRA; DGUV Regel 100-500)", () => {
    const r = solveLevel(
      at(0.3, 0, -0.3),
      [lp("A", -1, -1, 0), lp("B", 1, -1, 0), lp("C", 1, 1, 0), lp("D", -1, 1, 0)],
      1.5,
    );
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const s = r.solution;
    expect(s.rating.effectiveLegs).toBe(2);
    // Diagonal B-D passes through x = 0 at y = 0; the CoG plumb point (0.3, 0) projects onto it at
    // (0.15, -0.15): lever-rule shares 0.575 (B) and 0.425 (D) (geometry, worked by hand).
    const b = s.legs[1]!;
    const expected = (0.575 * 1000) / Math.cos((b.angleFromVerticalDeg * Math.PI) / 180);
    expect(s.rating.legs[1]!.designTensionKg).toBeCloseTo(Math.max(expected, b.tensionKg), 9);
    expect(s.rating.designTensionKg).toBeGreaterThan(Math.max(...s.legs.map((l) => l.tensionKg)));
  });
  it("one leg off the plumb line in given-lengths mode tilts the load by atan(offset / height)", () => {
    const r = solveGivenLengths(at(0, 0, 0), [lp("A", 0.3, 0, 0.4)], [1]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.solution.tiltDeg).toBeCloseTo((Math.atan2(0.3, 0.4) * 180) / Math.PI, 9);
    expect(r.solution.legs[0]!.tensionKg).toBeCloseTo(1000, 9);
    expect(r.solution.warnings.map((w) => w.code)).toContain("LOAD_TILTS");
  });
});

describe("beams with vertical drops", () => {
  it("2 drops share by the lever rule: 800/200 mm either side of the CoG -> 400/1600 kg (Furley Engineering 'Sling Load' vertical shares)", () => {
    const r = solveBeamDrops(2000, { x: 0, y: 0, z: -0.5 }, [lp("far", 0.8, 0, 0), lp("near", -0.2, 0, 0)]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.solution.drops[0]!.tensionKg).toBeCloseTo(400, 9);
    expect(r.solution.drops[1]!.tensionKg).toBeCloseTo(1600, 9);
    expect(r.solution.warnings).toEqual([]);
  });
  it("3 drops share like the determinate 3-leg vertical shares 5/49, 4/7, 16/49 (mrhengineering.dk example, derived)", () => {
    const r = solveBeamDrops(49, { x: 0.5, y: 0.4, z: -0.2 }, [
      lp("1", 0.1, 0, 0),
      lp("2", 0.8, 0.3, 0),
      lp("3", 0.1, 0.7, 0),
    ]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.solution.drops.map((d) => d.tensionKg)).toEqual([
      expect.closeTo(5, 9),
      expect.closeTo(28, 9),
      expect.closeTo(16, 9),
    ]);
  });
  it("4 drops around the CoG share elastically, a quarter each when symmetric (common practice)", () => {
    const r = solveBeamDrops(1000, { x: 0, y: 0, z: -1 }, [
      lp("A", -1, -1, 0),
      lp("B", 1, -1, 0),
      lp("C", 1, 1, 0),
      lp("D", -1, 1, 0),
    ]);
    expect(r.ok && r.solution.drops.map((d) => d.tensionKg)).toEqual(
      [250, 250, 250, 250].map((x) => expect.closeTo(x, 9)),
    );
  });
  it("warns when the load's CoG is not below its lift points", () => {
    const r = solveBeamDrops(1000, { x: 0, y: 0, z: 0.2 }, [lp("A", -1, 0, 0), lp("B", 1, 0, 0)]);
    expect(r.ok && r.solution.warnings.map((w) => w.code)).toEqual(["BEAM_LOAD_UNSTABLE"]);
  });
  it("the beam's mass joins the hook load", () => {
    const r = solveBeamLift(
      2000,
      { x: 0, y: 0, z: -0.5 },
      [lp("A", -1, 0, 0), lp("B", 1, 0, 0)],
      { massKg: 150, cog: { x: 0, y: 0, z: 0.2 }, topLugs: [{ x: 0, y: 0, z: 0.3 }] },
      1.3,
    );
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.solution.hookMassKg).toBe(2150);
    expect(r.solution.top.legs[0]!.tensionKg).toBeCloseTo(2150, 9);
  });
  it("drops off the line of the CoG are refused", () => {
    const r = solveBeamDrops(1000, { x: 0, y: 0.2, z: -1 }, [lp("A", -1, 0, 0), lp("B", 1, 0, 0)]);
    expect(r.ok).toBe(false);
  });
});
