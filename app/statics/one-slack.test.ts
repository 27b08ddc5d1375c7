// Multi-leg ratings on the safe side: a 4-leg bridle (or 3-4 beam drops) that is not symmetric is
// rated for every statically admissible state with a leg slack and for the 2-leg (diagonal) figure;
// a symmetric one keeps the standards' 3-leg assumption with the 2-leg figure shown beside it.
import fc from "fast-check";
import { lusolve } from "mathjs";
import { describe, expect, it } from "vitest";
import { solveBeamDrops } from "./beam";
import { solveGivenLengths, solveLevel, type BridleSolution, type LiftPoint } from "./bridle";
import { STANDARD_GRAVITY_MS2 } from "./units";

const RUNS = Number(process.env.STATICS_LAW_RUNS ?? 300);
const UP = { x: 0, y: 0, z: 1 };
const lp = (id: string, x: number, y: number, z: number): LiftPoint => ({ id, position: { x, y, z }, axis: UP });
const coord = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
const GOVERNORS = ["determinate", "elastic", "three-leg-uniform", "one-slack", "diagonal"];

/** Solves A t = b with mathjs (independent of the core's Cramer's rule); null when singular. */
function mathSolve(a: number[][], b: number[]): number[] | null {
  try {
    const x = lusolve(a, b) as unknown as number[][];
    const t = x.map((r) => r[0]!);
    return t.every(Number.isFinite) ? t : null;
  } catch {
    return null;
  }
}

/** Every one-slack state of a solved 4-leg bridle: the 3 other legs' determinate tensions (kN), when all >= 0. */
function bridleOneSlackStates(s: BridleSolution): Array<{ slack: number; t: number[] }> {
  const out: Array<{ slack: number; t: number[] }> = [];
  const u = s.legs.map((l) => l.direction);
  const w = s.weightKn;
  for (let m = 0; m < 4; m++) {
    const tri = [0, 1, 2, 3].filter((k) => k !== m);
    const a = [0, 1, 2].map((row) => tri.map((k) => [u[k]!.x, u[k]!.y, u[k]!.z][row]!));
    const t = mathSolve(a, [w * s.vertical.x, w * s.vertical.y, w * s.vertical.z]);
    if (t === null || t.some((x) => x < -1e-9 * w)) continue;
    const full = [0, 0, 0, 0];
    tri.forEach((k, j) => (full[k] = t[j]!));
    out.push({ slack: m, t: full });
  }
  return out;
}

describe("4-leg bridle, not symmetric: one-slack states and the diagonal (statics, worked by hand)", () => {
  // Lift points A(-2,-1), B(2,0), C(1,1), D(0,1) at z = 0; CoG plumb point (0,0), 0.5 m below; hook 2 m above.
  // One slack: the other three carry the vertical shares of the CoG's barycentric coordinates in their triangle:
  // C slack -> A, B, D 1/3 each; D slack -> A 2/5, B 1/5, C 2/5; A or B slack -> a share would be negative.
  // Diagonals A-C and B-D (lever rule on the CoG's projection): A 5/13, C 8/13; B 1/5, D 4/5.
  // Tension = vertical share x W x L / h, L = 3, 2 sqrt 2, sqrt 6, sqrt 5 m, h = 2 m.
  const points = [lp("A", -2, -1, 0), lp("B", 2, 0, 0), lp("C", 1, 1, 0), lp("D", 0, 1, 0)];
  const r = solveLevel({ massKg: 1000, cog: { x: 0, y: 0, z: -0.5 } }, points, 2);
  if (!r.ok) throw new Error(r.message);
  const rating = r.solution.rating;
  it("is not symmetric, and rated as if 2 legs carry (DGUV Regel 100-500; NAVEDTRA)", () => {
    expect(rating.symmetric).toBe(false);
    expect(rating.effectiveLegs).toBe(2);
  });
  it("A: 2/5 W x 3/2 = 600 kg with D slack, above its diagonal figure 5/13 W x 3/2 = 576.9 kg", () => {
    const a = rating.legs[0]!;
    expect(a.designTensionKg).toBeCloseTo(600, 9);
    expect(a.governedBy).toBe("one-slack");
    expect(a.slackLegIds).toEqual(["D"]);
    expect(a.twoLegTensionKg).toBeCloseTo((5 / 13) * 1500, 9);
    expect(a.source).toContain("DGUV Regel 100-500");
  });
  it("B: 1/3 W x sqrt 2 = 471.4 kg with C slack, above its diagonal figure 1/5 W x sqrt 2 = 282.8 kg", () => {
    const b = rating.legs[1]!;
    expect(b.designTensionKg).toBeCloseTo((1000 / 3) * Math.SQRT2, 9);
    expect(b.governedBy).toBe("one-slack");
    expect(b.slackLegIds).toEqual(["C"]);
    expect(b.twoLegTensionKg).toBeCloseTo(200 * Math.SQRT2, 9);
  });
  it("C and D: their diagonal figures govern, 8/13 W x sqrt 6 / 2 and 4/5 W x sqrt 5 / 2 (NAVEDTRA: rate as 2-leg)", () => {
    const [, , c, d] = rating.legs;
    expect(c!.designTensionKg).toBeCloseTo(((8 / 13) * 1000 * Math.sqrt(6)) / 2, 9);
    expect(c!.governedBy).toBe("diagonal");
    expect(c!.oneSlackTensionKg).toBeCloseTo((0.4 * 1000 * Math.sqrt(6)) / 2, 9);
    expect(d!.designTensionKg).toBeCloseTo((0.8 * 1000 * Math.sqrt(5)) / 2, 9);
    expect(d!.governedBy).toBe("diagonal");
    expect(d!.source).toContain("NAVEDTRA");
    expect(rating.designTensionKg).toBeCloseTo(400 * Math.sqrt(5), 9);
  });
  it("every leg is rated for at least its statics share", () => {
    r.solution.legs.forEach((leg, i) => expect(rating.legs[i]!.designTensionKg).toBeGreaterThanOrEqual(leg.tensionKg));
  });
});

describe("4-leg bridle, symmetric: the standards' 3-leg assumption, with the 2-leg figure beside it (DGUV Regel 100-500)", () => {
  it("square, beta 45 deg: each leg rated W / (3 cos 45) = 471.4 kg; 2-leg figure W / (2 cos 45) = 707.1 kg shown", () => {
    const r = solveLevel(
      { massKg: 1000, cog: { x: 0, y: 0, z: -0.3 } },
      [lp("A", -1, -1, 0), lp("B", 1, -1, 0), lp("C", 1, 1, 0), lp("D", -1, 1, 0)],
      Math.SQRT2,
    );
    if (!r.ok) throw new Error(r.message);
    for (const leg of r.solution.rating.legs) {
      expect(leg.governedBy).toBe("three-leg-uniform");
      expect(leg.designTensionKg).toBeCloseTo(1000 / (3 * Math.SQRT1_2), 9);
      expect(leg.twoLegTensionKg).toBeCloseTo(1000 / (2 * Math.SQRT1_2), 9);
      expect(leg.rule).toMatch(/3 taken to carry/);
    }
  });
});

describe("beam drops rated like legs", () => {
  it("4 drops on a square, symmetric: W/3 = 333.3 kg each (DGUV Regel 100-500), 2-leg figure W/2 = 500 kg beside it; shares stay 250 kg", () => {
    const r = solveBeamDrops(1000, { x: 0, y: 0, z: -1 }, [
      lp("A", -1, -1, 0),
      lp("B", 1, -1, 0),
      lp("C", 1, 1, 0),
      lp("D", -1, 1, 0),
    ]);
    if (!r.ok) throw new Error(r.message);
    expect(r.solution.drops.map((d) => d.tensionKg)).toEqual([250, 250, 250, 250].map((x) => expect.closeTo(x, 9)));
    expect(r.solution.rating.symmetric).toBe(true);
    for (const leg of r.solution.rating.legs) {
      expect(leg.designTensionKg).toBeCloseTo(1000 / 3, 9);
      expect(leg.governedBy).toBe("three-leg-uniform");
      expect(leg.twoLegTensionKg).toBeCloseTo(500, 9);
    }
  });
  it("4 drops, not symmetric (the bridle's plan above): A 400, B 333.3 one slack; C 615.4, D 800 diagonal (worked by hand)", () => {
    const r = solveBeamDrops(1000, { x: 0, y: 0, z: -1 }, [
      lp("A", -2, -1, 0),
      lp("B", 2, 0, 0),
      lp("C", 1, 1, 0),
      lp("D", 0, 1, 0),
    ]);
    if (!r.ok) throw new Error(r.message);
    const legs = r.solution.rating.legs;
    expect(legs.map((l) => l.designTensionKg)).toEqual(
      [400, 1000 / 3, 8000 / 13, 800].map((x) => expect.closeTo(x, 9)),
    );
    expect(legs.map((l) => l.governedBy)).toEqual(["one-slack", "one-slack", "diagonal", "diagonal"]);
    r.solution.drops.forEach((d, i) => expect(legs[i]!.designTensionKg).toBeGreaterThanOrEqual(d.tensionKg));
  });
  it("3 drops in line, CoG between: each pair carrying by the lever rule V = W b / (a + b) bounds the drops (Furley Engineering 'Sling Load' lever rule)", () => {
    // A(-1,0), B(0,0), C(2,0), CoG at x = 0.5: pair A-C 500/500 kg, pair B-C 750/250 kg, pair A-B cannot carry it.
    const r = solveBeamDrops(1000, { x: 0.5, y: 0, z: -1 }, [lp("A", -1, 0, 0), lp("B", 0, 0, 0), lp("C", 2, 0, 0)]);
    if (!r.ok) throw new Error(r.message);
    expect(r.solution.rating.legs.map((l) => l.designTensionKg)).toEqual(
      [500, 750, 500].map((x) => expect.closeTo(x, 9)),
    );
    // Elastic share of equal drops, t = a + b x about the CoG (x = -1.5, -0.5, 1.5): 8/28, 9/28, 11/28 of W
    // (derived) - below every design figure.
    expect(r.solution.drops.map((d) => d.tensionKg)).toEqual(
      [8000 / 28, 9000 / 28, 11000 / 28].map((x) => expect.closeTo(x, 9)),
    );
  });
  it("2 drops keep the lever rule (Furley Engineering 'Sling Load': 1600 / 400 kg)", () => {
    const r = solveBeamDrops(2000, { x: 0, y: 0, z: -0.5 }, [lp("near", -0.2, 0, 0), lp("far", 0.8, 0, 0)]);
    if (!r.ok) throw new Error(r.message);
    expect(r.solution.rating.legs.map((l) => l.designTensionKg)).toEqual([
      expect.closeTo(1600, 9),
      expect.closeTo(400, 9),
    ]);
    expect(r.solution.rating.legs.every((l) => l.governedBy === "determinate")).toBe(true);
  });
});

/** 4 lift points around the CoG's plumb line at varied radii, angles and heights; hook high enough for <= 60 deg legs. */
const arbFour = fc
  .record({
    gz: coord(-2, 2),
    base: coord(0, 2 * Math.PI),
    jitter: fc.array(coord(-0.45, 0.45), { minLength: 4, maxLength: 4 }),
    radii: fc.array(coord(0.2, 2.5), { minLength: 4, maxLength: 4 }),
    dz: fc.array(coord(-1, 1.5), { minLength: 4, maxLength: 4 }),
    rise: coord(0.6, 3),
    massKg: coord(1, 50000),
  })
  .map((r) => {
    const points = r.radii.map((rad, i) => {
      const phi = r.base + (i * Math.PI) / 2 + r.jitter[i]! * (Math.PI / 4);
      return lp(String.fromCharCode(65 + i), rad * Math.cos(phi), rad * Math.sin(phi), r.gz + r.dz[i]!);
    });
    const top = Math.max(r.gz, ...points.map((p) => p.position.z));
    return { massKg: r.massKg, cog: { x: 0, y: 0, z: r.gz }, points, hookZ: top + r.rise * Math.max(...r.radii) };
  });

function checkRatingLaw(s: BridleSolution): void {
  const w = s.weightKn;
  s.rating.legs.forEach((d, i) => {
    expect(GOVERNORS).toContain(d.governedBy);
    expect(d.designTensionKn).toBeGreaterThanOrEqual(s.legs[i]!.tensionKn * (1 - 1e-12));
    expect(d.designTensionKg).toBeCloseTo((d.designTensionKn * 1000) / STANDARD_GRAVITY_MS2, 6);
  });
  if (s.rating.symmetric) {
    for (const d of s.rating.legs) expect(d.twoLegTensionKn).toBeDefined();
    return;
  }
  // 1e-8 W allows for rounding where the layout is nearly degenerate (the CoG on both diagonals, lift points
  // a hair out of one plane): the two solvers then agree to about 1e-9 of the weight.
  for (const state of bridleOneSlackStates(s)) {
    state.t.forEach((t, i) => expect(s.rating.legs[i]!.designTensionKn).toBeGreaterThanOrEqual(t - 1e-8 * w));
  }
  for (const d of s.rating.legs) expect(d.designTensionKn).toBeGreaterThanOrEqual(d.twoLegTensionKn! * (1 - 1e-12));
}

describe("law: a leg's design load is at least its load in every admissible one-slack state (not symmetric)", () => {
  it("level mode, 4 legs, CoG below or above the lift points", () => {
    fc.assert(
      fc.property(arbFour, (c) => {
        const r = solveLevel({ massKg: c.massKg, cog: c.cog }, c.points, c.hookZ);
        if (!r.ok) throw new Error(`${r.code}: ${r.message}`);
        checkRatingLaw(r.solution);
      }),
      { numRuns: RUNS },
    );
  });
  it("given-lengths mode, 4 legs with slings up to 3 % off the level lengths", () => {
    fc.assert(
      fc.property(arbFour, fc.array(coord(-0.03, 0.03), { minLength: 4, maxLength: 4 }), (c, off) => {
        const level = solveLevel({ massKg: c.massKg, cog: c.cog }, c.points, c.hookZ);
        if (!level.ok) throw new Error(`${level.code}: ${level.message}`);
        const r = solveGivenLengths(
          { massKg: c.massKg, cog: c.cog },
          c.points,
          level.solution.legs.map((l, i) => l.lengthM * (1 + off[i]!)),
        );
        if (!r.ok) return; // refusals are covered by the given-lengths tests
        checkRatingLaw(r.solution);
      }),
      { numRuns: RUNS },
    );
  });
  it("beam, 3 or 4 drops: each drop at least its load in every state with a drop slack that carries the load (mathjs solve)", () => {
    fc.assert(
      fc.property(fc.constantFrom(3, 4), arbFour, (n, c) => {
        const points = c.points.slice(0, n).map((p) => lp(p.id, p.position.x, p.position.y, 0));
        const r = solveBeamDrops(c.massKg, { x: 0, y: 0, z: -1 }, points);
        if (!r.ok) return; // CoG outside the drops' support: refused
        const s = r.solution;
        const w = (c.massKg * STANDARD_GRAVITY_MS2) / 1000;
        s.drops.forEach((d, i) =>
          expect(s.rating.legs[i]!.designTensionKn).toBeGreaterThanOrEqual(d.tensionKn * (1 - 1e-12)),
        );
        if (s.rating.symmetric) return;
        for (let m = 0; m < n; m++) {
          const carry = points.map((_, k) => k).filter((k) => k !== m);
          if (carry.length !== 3) continue;
          const a = [
            carry.map(() => 1),
            carry.map((k) => points[k]!.position.x),
            carry.map((k) => points[k]!.position.y),
          ];
          const t = mathSolve(a, [w, 0, 0]);
          if (t === null || t.some((x) => x < -1e-9 * w)) continue;
          carry.forEach((k, j) => expect(s.rating.legs[k]!.designTensionKn).toBeGreaterThanOrEqual(t[j]! - 1e-8 * w));
        }
      }),
      { numRuns: RUNS },
    );
  });
});
