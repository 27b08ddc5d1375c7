import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  COMPOSITE_COG_TOLERANCE_M,
  COMPOSITE_MASS_TOLERANCE,
  compositeDisagreements,
  compositeMassAndCog,
} from "./composite";

describe("composite mass and CoG", () => {
  it("a 1000 kg element and a 250 kg coupling 1.2 m away: G sits 0.24 m from the element (lever rule, common practice)", () => {
    const result = compositeMassAndCog([
      { name: "element", massKg: 1000, position: { x: 0, y: 0, z: 0.5 } },
      { name: "coupling", massKg: 250, position: { x: 1.2, y: 0, z: 0.5 } },
    ]);
    expect(result?.massKg).toBe(1250);
    expect(result?.cog.x).toBeCloseTo(0.24, 12);
    expect(result?.cog.z).toBeCloseTo(0.5, 12);
    expect(result?.momentKgM.x).toBeCloseTo(300, 9);
  });

  it("no parts, or parts of no mass, give no result", () => {
    expect(compositeMassAndCog([])).toBeNull();
    expect(compositeMassAndCog([{ name: "x", massKg: 0, position: { x: 1, y: 1, z: 1 } }])).toBeNull();
  });

  const part = fc.record({
    name: fc.string(),
    massKg: fc.double({ min: 0.1, max: 50_000, noNaN: true }),
    position: fc.record({
      x: fc.double({ min: -10, max: 10, noNaN: true }),
      y: fc.double({ min: -10, max: 10, noNaN: true }),
      z: fc.double({ min: -10, max: 10, noNaN: true }),
    }),
  });

  it("law: G lies within the box of the parts' positions, and the moment about G is zero", () => {
    fc.assert(
      fc.property(fc.array(part, { minLength: 1, maxLength: 8 }), (parts) => {
        const r = compositeMassAndCog(parts)!;
        for (const axis of ["x", "y", "z"] as const) {
          const values = parts.map((p) => p.position[axis]);
          expect(r.cog[axis]).toBeGreaterThanOrEqual(Math.min(...values) - 1e-9);
          expect(r.cog[axis]).toBeLessThanOrEqual(Math.max(...values) + 1e-9);
          const momentAboutG = parts.reduce((s, p) => s + p.massKg * (p.position[axis] - r.cog[axis]), 0);
          expect(Math.abs(momentAboutG)).toBeLessThan(1e-7 * r.massKg * 10);
        }
      }),
    );
  });

  it("law: the order of the parts does not matter", () => {
    fc.assert(
      fc.property(fc.array(part, { minLength: 1, maxLength: 6 }), (parts) => {
        const a = compositeMassAndCog(parts)!;
        const b = compositeMassAndCog([...parts].reverse())!;
        expect(b.massKg).toBeCloseTo(a.massKg, 6);
        expect(b.cog.x).toBeCloseTo(a.cog.x, 9);
      }),
    );
  });
});

describe("the composite sum against the component's own figures", () => {
  // The 1000 kg element with a 250 kg coupling 1.2 m away: 1250 kg, G at x = 0.24 m (lever rule, common practice).
  const composite = compositeMassAndCog([
    { name: "element", massKg: 1000, position: { x: 0, y: 0, z: 0.5 } },
    { name: "coupling", massKg: 250, position: { x: 1.2, y: 0, z: 0.5 } },
  ])!;

  it("agrees within 2 % of the mass and 5 mm of the CoG (common practice): no warning", () => {
    expect(compositeDisagreements(composite, { massKg: 1240, cog: { x: 0.243, y: 0, z: 0.5 } })).toEqual([]);
    expect(COMPOSITE_MASS_TOLERANCE).toBe(0.02);
    expect(COMPOSITE_COG_TOLERANCE_M).toBe(0.005);
  });

  it("a component entered at 1200 kg with its CoG at the element's centre: both disagree", () => {
    const found = compositeDisagreements(composite, { massKg: 1200, cog: { x: 0, y: 0, z: 0.5 } });
    const mass = found.find((d) => d.kind === "mass");
    const cog = found.find((d) => d.kind === "cog");
    // (1250 - 1200) / 1200 = 4.17 %, over 2 %; the CoGs are 240 mm apart, over 5 mm.
    expect(mass && mass.kind === "mass" && mass.difference).toBeCloseTo(50 / 1200, 12);
    expect(cog && cog.kind === "cog" && cog.distanceM).toBeCloseTo(0.24, 12);
  });

  it("just past the tolerances warns, and a figure not given is not compared", () => {
    expect(compositeDisagreements(composite, { massKg: 1250 / 1.021, cog: null }).map((d) => d.kind)).toEqual(["mass"]);
    expect(
      compositeDisagreements(composite, { massKg: null, cog: { x: 0.246, y: 0, z: 0.5 } }).map((d) => d.kind),
    ).toEqual(["cog"]);
    expect(compositeDisagreements(composite, { massKg: null, cog: null })).toEqual([]);
  });
});
