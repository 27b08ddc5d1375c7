import fc from "fast-check";
import { describe, expect, it } from "vitest";
import {
  formatLength,
  formatMass,
  fromDisplayLength,
  fromDisplayMass,
  toDisplayLength,
  toDisplayMass,
} from "~/utils/format";

describe("display units", () => {
  it("1 in = 25.4 mm and 1 lb = 0.45359237 kg exactly (international yard and pound, 1959)", () => {
    expect(fromDisplayLength(1, "imperial")).toBeCloseTo(0.0254, 15);
    expect(fromDisplayMass(1, "imperial")).toBeCloseTo(0.45359237, 15);
    expect(toDisplayLength(1, "metric")).toBeCloseTo(1000, 12);
  });

  it("formats in the user's units", () => {
    expect(formatLength(1.25, "metric")).toBe("1,250 mm");
    expect(formatLength(0.0254 * 49.21, "imperial")).toBe("49.21 in");
    expect(formatMass(2000, "metric")).toBe("2,000 kg");
    expect(formatMass(2000, "imperial")).toBe("4,409 lb");
  });

  it("law: display and back is the identity", () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e4, max: 1e4, noNaN: true }),
        fc.constantFrom("metric" as const, "imperial" as const),
        (v, units) => {
          expect(fromDisplayLength(toDisplayLength(v, units), units)).toBeCloseTo(v, 9);
          expect(fromDisplayMass(toDisplayMass(v, units), units)).toBeCloseTo(v, 9);
        },
      ),
    );
  });
});
