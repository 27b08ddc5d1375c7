import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { readTypedNumber, readTypedQuantity, typedNumberField } from "~/utils/numbers";

const read = (text: string) => readTypedNumber(text);
const value = (text: string) => {
  const result = readTypedNumber(text);
  if (!result.ok) throw new Error(`${text} refused: ${result.message}`);
  return result.value;
};

describe("reading a number as people type it", () => {
  it("takes a decimal point or a decimal comma, and digits grouped in threes by commas, points or spaces", () => {
    expect(value("1240")).toBe(1240);
    expect(value("1,240.5")).toBe(1240.5);
    expect(value("1.240,5")).toBe(1240.5);
    expect(value("1 240,5")).toBe(1240.5);
    expect(value("1\u202f240,5")).toBe(1240.5); // narrow no-break space, as French formatting writes it
    expect(value("1,240,000")).toBe(1240000);
    expect(value("1.240.000")).toBe(1240000);
    expect(value("1,5")).toBe(1.5);
    expect(value("0,250")).toBe(0.25);
    expect(value("1234,567")).toBe(1234.567); // four digits before: the comma cannot be a thousands separator
    expect(value(".5")).toBe(0.5);
    expect(value("-12,5")).toBe(-12.5);
    expect(value("\u221212.5")).toBe(-12.5); // the minus sign word processors use
    expect(value("+7")).toBe(7);
    expect(value("1.2e3")).toBe(1200);
  });

  it("never reads 1.240,5 as 1.2, nor any half of a number", () => {
    expect(read("1.240,5")).toEqual({ ok: true, value: 1240.5 });
    expect(read("1.2,5")).toMatchObject({ ok: false });
    expect(read("1,2.5")).toMatchObject({ ok: false });
    expect(read("1.240.5")).toMatchObject({ ok: false });
  });

  it("refuses what reads two ways, saying both", () => {
    expect(read("1,240")).toEqual({
      ok: false,
      message: "“1,240” could mean 1240 or 1.24: type 1240 or 1.24 to say which.",
    });
    expect(read("1.240")).toMatchObject({ ok: false, message: expect.stringContaining("1240 or 1.24") });
    expect(read("-2,000")).toMatchObject({ ok: false, message: expect.stringContaining("-2000 or -2") });
    expect(read("1 240,000")).toMatchObject({ ok: false, message: expect.stringContaining("1240000 or 1240") });
  });

  it("refuses uneven groups, stray signs and letters with a sentence", () => {
    for (const text of ["1,24,000", "12 34", "1,,240", "5.", "1 240.000,5", "- 5", "abc", "1-2", "0x10", "Infinity"]) {
      const result = read(text);
      expect(result.ok, text).toBe(false);
      if (!result.ok) expect(result.message, text).toMatch(/^“.+”|^Enter/);
    }
    expect(read("   ")).toEqual({ ok: false, message: "Enter a number." });
    expect(read(`1${"0".repeat(400)}`)).toMatchObject({ ok: false, message: expect.stringContaining("too large") });
  });

  it("splits a unit typed after the number, with or without a space", () => {
    expect(readTypedQuantity("1240 kg")).toEqual({ ok: true, value: 1240, unit: "kg" });
    expect(readTypedQuantity("2.5t")).toEqual({ ok: true, value: 2.5, unit: "t" });
    expect(readTypedQuantity("1 240,5 kg")).toEqual({ ok: true, value: 1240.5, unit: "kg" });
    expect(readTypedQuantity('12"')).toEqual({ ok: true, value: 12, unit: '"' });
    expect(readTypedQuantity("1,240.5")).toEqual({ ok: true, value: 1240.5, unit: null });
    expect(readTypedQuantity("kg")).toMatchObject({ ok: false });
    expect(readTypedQuantity("1,240 kg")).toMatchObject({ ok: false });
  });

  it("gives zod a field that reads the number or reports why not", () => {
    const field = typedNumberField("contingency", { suffix: "%" });
    expect(field.parse("7,5")).toBe(7.5);
    expect(field.parse("10 %")).toBe(10);
    expect(field.safeParse("").error?.issues[0]?.message).toBe("Enter the contingency as a number.");
    expect(field.safeParse("10 kg").error?.issues[0]?.message).toBe(
      "Enter the contingency as a number, without a unit.",
    );
    expect(field.safeParse("1,240").error?.issues[0]?.message).toContain("could mean");
  });
});

// Formatted by Intl (ICU's locale data), an outside formatter: en-US groups with commas, de-DE with points and a
// decimal comma, fr-FR with narrow no-break spaces and a decimal comma; and without grouping in each.
const LOCALES = ["en-US", "de-DE", "fr-FR", "en-GB", "es-ES", "it-IT"] as const;

describe("law: a number formatted in any of these conventions reads back as itself or is refused", () => {
  const typed = fc.record({
    scaled: fc.integer({ min: -1e12, max: 1e12 }),
    decimals: fc.integer({ min: 0, max: 6 }),
    locale: fc.constantFrom(...LOCALES),
    grouping: fc.boolean(),
  });
  type Typed = { scaled: number; decimals: number; locale: string; grouping: boolean };
  const format = ({ scaled, decimals, locale, grouping }: Typed) => {
    const x = scaled / 10 ** decimals;
    const text = new Intl.NumberFormat(locale, {
      minimumFractionDigits: decimals,
      maximumFractionDigits: decimals,
      useGrouping: grouping,
    }).format(x);
    return { text, expected: Number(x.toFixed(decimals)) };
  };

  it("never another number", () => {
    fc.assert(
      fc.property(typed, (t) => {
        const { text, expected } = format(t);
        const result = readTypedNumber(text);
        if (result.ok) expect(result.value).toBe(expected);
      }),
      { numRuns: 2000 },
    );
  });

  it("always itself unless it shows exactly three digits after its only separator", () => {
    fc.assert(
      fc.property(typed, (t) => {
        const { text, expected } = format(t);
        const separators = text.match(/[.,\s\u202f\u00a0]/g) ?? [];
        const lone = separators.length === 1 && /[.,]\d{3}$/.test(text);
        const spaceGroupedThreeDecimals = /\s/.test(text) && /,\d{3}$/.test(text) && !/[.]/.test(text);
        if (lone || spaceGroupedThreeDecimals) return;
        expect(readTypedNumber(text)).toEqual({ ok: true, value: expected });
      }),
      { numRuns: 2000 },
    );
  });

  it("and a unit after it does not change the number", () => {
    fc.assert(
      fc.property(typed, fc.constantFrom("kg", "t", "mm", "in", '"'), fc.constantFrom("", " "), (t, unit, gap) => {
        const { text } = format(t);
        const alone = readTypedNumber(text);
        const withUnit = readTypedQuantity(`${text}${gap}${unit}`);
        expect(withUnit.ok).toBe(alone.ok);
        if (alone.ok && withUnit.ok) expect(withUnit).toEqual({ ok: true, value: alone.value, unit });
      }),
      { numRuns: 1000 },
    );
  });
});
