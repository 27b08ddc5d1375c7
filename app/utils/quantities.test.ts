import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { convertLength, convertMass, type LengthUnit, type MassUnit } from "~/statics/units";
import { amountField, readTypedAmount } from "~/utils/quantities";

const kg = (text: string, unitIfNone: "kg" | "lb" = "kg") => readTypedAmount(text, "mass", unitIfNone, "kg");
const metres = (text: string, unitIfNone: "mm" | "in" = "mm") => readTypedAmount(text, "length", unitIfNone, "m");

describe("masses and lengths typed with their unit", () => {
  it("reads the units on lifting gear and drawings (1 t = 1000 kg; 1 lb = 0.45359237 kg and 1 in = 25.4 mm exact, international yard and pound 1959)", () => {
    expect(kg("1240 kg")).toEqual({ ok: true, value: 1240 });
    expect(kg("2.5 t")).toEqual({ ok: true, value: 2500 });
    expect(kg("2,5t")).toEqual({ ok: true, value: 2500 });
    expect(kg("1 240,5 kg")).toEqual({ ok: true, value: 1240.5 });
    expect(kg("1,240.5")).toEqual({ ok: true, value: 1240.5 });
    expect(kg("1.240,5 KG")).toEqual({ ok: true, value: 1240.5 });
    expect(kg("1000 lb")).toMatchObject({ ok: true, value: expect.closeTo(453.59237, 9) });
    expect(kg("2 short tons")).toMatchObject({ ok: true, value: expect.closeTo(1814.36948, 9) }); // 2 x 2000 lb
    expect(metres("12 in")).toMatchObject({ ok: true, value: expect.closeTo(0.3048, 12) });
    expect(metres('12"')).toMatchObject({ ok: true, value: expect.closeTo(0.3048, 12) });
    expect(metres("3 ft")).toMatchObject({ ok: true, value: expect.closeTo(0.9144, 12) });
    expect(metres("1,6 m")).toEqual({ ok: true, value: 1.6 });
    expect(metres("16 cm")).toMatchObject({ ok: true, value: expect.closeTo(0.16, 12) });
    expect(metres("900 MM")).toMatchObject({ ok: true, value: expect.closeTo(0.9, 12) }); // not megametres
  });

  it("takes a bare figure in the user's unit", () => {
    expect(kg("2000")).toEqual({ ok: true, value: 2000 });
    expect(kg("1000", "lb")).toMatchObject({ ok: true, value: expect.closeTo(453.59237, 9) });
    expect(metres("1600")).toEqual({ ok: true, value: 1.6 });
    expect(metres("60", "in")).toMatchObject({ ok: true, value: expect.closeTo(1.524, 12) });
  });

  it("refuses a unit of another quantity, an unknown or ambiguous unit, and a figure that reads two ways", () => {
    expect(kg("12 mm")).toEqual({ ok: false, message: "“mm” is a unit of length: give the mass in kg, t or lb." });
    expect(metres("5 kg")).toEqual({
      ok: false,
      message: "“kg” is a unit of mass: give the length in mm, m, in or ft.",
    });
    expect(kg("3 ton")).toMatchObject({ ok: false, message: expect.stringContaining("type t for tonnes") });
    expect(kg("9 kN")).toMatchObject({ ok: false, message: expect.stringContaining("not a unit of mass") });
    expect(kg("5 kg*m")).toMatchObject({ ok: false });
    expect(kg("5 constructor")).toMatchObject({ ok: false, message: expect.stringContaining("not a unit of mass") });
    expect(metres("1 240 mm")).toEqual({ ok: true, value: 1.24 });
    expect(kg("1,240 kg")).toMatchObject({ ok: false, message: expect.stringContaining("could mean 1240 or 1.24") });
    expect(kg("1e400 kg")).toMatchObject({ ok: false });
  });

  it("gives zod a field for WLLs and the like", () => {
    const wll = amountField("WLL", "mass", "t", "kg");
    expect(wll.parse("4,75")).toBe(4750);
    expect(wll.parse("3250 kg")).toBe(3250);
    expect(wll.safeParse("").error?.issues[0]?.message).toBe("Enter the WLL as a number.");
    expect(wll.safeParse("2 tons").error?.issues[0]?.message).toContain("1000 kg, 907 kg or 1016 kg");
  });

  it("law: mathjs's reading of a typed unit agrees with the exact factors of statics/units.ts", () => {
    const close = (a: number, b: number) =>
      expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(b)));
    fc.assert(
      fc.property(
        fc.double({ min: 0.001, max: 1e6, noNaN: true }),
        fc.constantFrom(["kg", "kg"], ["t", "t"], ["lb", "lb"], ["lbs", "lb"], ["short tons", "shortTon"] as const),
        (x, [typed, unit]) => {
          // Four decimals: three after a lone point would be refused as ambiguous ("1.240").
          const figure = x.toFixed(4);
          const read = kg(`${figure} ${typed}`);
          expect(read.ok, figure).toBe(true);
          if (read.ok) close(read.value, convertMass(Number(figure), unit as MassUnit, "kg"));
        },
      ),
    );
    fc.assert(
      fc.property(
        fc.double({ min: 0.001, max: 1e5, noNaN: true }),
        fc.constantFrom(["mm", "mm"], ["m", "m"], ["in", "in"], ["ft", "ft"], ["feet", "ft"] as const),
        (x, [typed, unit]) => {
          const figure = x.toFixed(4);
          const read = metres(`${figure} ${typed}`);
          expect(read.ok, figure).toBe(true);
          if (read.ok) close(read.value, convertLength(Number(figure), unit as LengthUnit, "m"));
        },
      ),
    );
  });
});
