import fc from "fast-check";
import { unit } from "mathjs";
import { describe, expect, it } from "vitest";
import { convertLength, convertMass, LENGTH_UNIT_M, MASS_UNIT_KG, type LengthUnit, type MassUnit } from "./units";

const MATHJS_MASS: Record<MassUnit, string> = { kg: "kg", t: "tonne", lb: "lbm", shortTon: "ton" };
const MATHJS_LENGTH: Record<LengthUnit, string> = { m: "m", mm: "mm", in: "in", ft: "ft" };
const massUnits = Object.keys(MASS_UNIT_KG) as MassUnit[];
const lengthUnits = Object.keys(LENGTH_UNIT_M) as LengthUnit[];

describe("unit factors agree with mathjs's unit definitions", () => {
  it.each(massUnits)("1 %s in kg", (u) =>
    expect(MASS_UNIT_KG[u]).toBeCloseTo(unit(1, MATHJS_MASS[u]).toNumber("kg"), 12),
  );
  it.each(lengthUnits)("1 %s in m", (u) =>
    expect(LENGTH_UNIT_M[u]).toBeCloseTo(unit(1, MATHJS_LENGTH[u]).toNumber("m"), 15),
  );

  it("every conversion matches mathjs to 1e-12 relative", () => {
    const value = fc.double({ min: 1e-6, max: 1e8, noNaN: true });
    fc.assert(
      fc.property(value, fc.constantFrom(...massUnits), fc.constantFrom(...massUnits), (v, from, to) => {
        const expected = unit(v, MATHJS_MASS[from]).toNumber(MATHJS_MASS[to]);
        expect(Math.abs(convertMass(v, from, to) - expected)).toBeLessThanOrEqual(1e-12 * Math.abs(expected));
      }),
    );
    fc.assert(
      fc.property(value, fc.constantFrom(...lengthUnits), fc.constantFrom(...lengthUnits), (v, from, to) => {
        const expected = unit(v, MATHJS_LENGTH[from]).toNumber(MATHJS_LENGTH[to]);
        expect(Math.abs(convertLength(v, from, to) - expected)).toBeLessThanOrEqual(1e-12 * Math.abs(expected));
      }),
    );
  });

  it("a value converted there and back is the value", () => {
    expect(convertLength(convertLength(1234.5, "mm", "in"), "in", "mm")).toBeCloseTo(1234.5, 9);
    expect(convertMass(convertMass(2000, "kg", "lb"), "lb", "kg")).toBeCloseTo(2000, 9);
  });
});
