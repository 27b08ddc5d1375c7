import { describe, expect, it } from "vitest";
import { componentFields } from "../../tests/support/component-fields";
import { indexedRows, parseComponentForm, parsePolygon } from "~/loads/component-input";

function form(fields: Record<string, string>) {
  const fd = new FormData();
  for (const [k, v] of Object.entries(fields)) fd.append(k, v);
  return fd;
}

describe("the component form", () => {
  it("turns millimetres and kilograms into SI and normalises threads", () => {
    const result = parseComponentForm(form(componentFields()), "metric");
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.data.massKg).toBe(2000);
    expect(result.data.lengthM).toBeCloseTo(1.6, 12);
    expect(result.data.cog.z).toBeCloseTo(0.4, 12);
    expect(result.data.liftPoints.map((p) => [p.label, p.position.x, p.thread, p.engagementMm])).toEqual([
      ["A", -0.8, "M20", 30],
      ["B", 0.2, "M20", null],
    ]);
    expect(result.data.outlineElevation).toEqual([
      [-0.8, 0],
      [0.8, 0],
      [0.8, 0.9],
      [-0.8, 0.9],
    ]);
  });

  it("reads inches and pounds for an imperial user (1 in = 25.4 mm, 1 lb = 0.45359237 kg, exact)", () => {
    const result = parseComponentForm(
      form(
        componentFields({
          mass: "1000",
          length: "60",
          width: "30",
          height: "36",
          cogZ: "18",
          "lp-0-x": "-30",
          "lp-0-z": "36",
          "lp-1-x": "10",
          "lp-1-z": "36",
          "lp-0-engagement": "1",
        }),
      ),
      "imperial",
    );
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.data.massKg).toBeCloseTo(453.59237, 9);
    expect(result.data.lengthM).toBeCloseTo(1.524, 12);
    expect(result.data.liftPoints[0]!.engagementMm).toBeCloseTo(25.4, 9);
  });

  it("refuses control characters in lift point ids, threads and part names, which the multi-row insert cannot store", () => {
    const result = parseComponentForm(
      form(
        componentFields({
          "lp-1-label": "B\u0000",
          "lp-0-thread": "M20\u001b",
          "part-0-name": "Motor\u0000",
          "part-0-mass": "100",
          "part-0-x": "0",
          "part-0-y": "0",
          "part-0-z": "400",
        }),
      ),
      "metric",
    );
    const message =
      "Remove the invisible control or text-direction character (such as NUL or a right-to-left override) from this field.";
    expect(result).toEqual({
      ok: false,
      errors: { "lp-0-thread": [message], "lp-1-label": [message], "part-0-name": [message] },
    });
  });

  it("an estimated mass must carry a contingency", () => {
    const result = parseComponentForm(
      form(componentFields({ massSource: "estimated", contingencyPct: "0" })),
      "metric",
    );
    expect(result).toEqual({
      ok: false,
      errors: { contingencyPct: ["An estimated mass must carry a contingency above 0 %."] },
    });
  });

  it("names each bad field", () => {
    const result = parseComponentForm(
      form(
        componentFields({
          mass: "-5",
          cogZ: "2000",
          "lp-1-label": "a",
          "lp-0-ax": "0",
          "lp-0-az": "0",
          "lp-1-x": "wide",
        }),
      ),
      "metric",
    );
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(Object.keys(result.errors).sort()).toEqual(["lp-0-ax", "lp-1-x", "mass"].sort());
    const again = parseComponentForm(form(componentFields({ cogZ: "2000", "lp-1-label": "a" })), "metric");
    expect(again.ok).toBe(false);
    if (again.ok) return;
    expect(again.errors.cogZ?.[0]).toMatch(/outside the component's outline along z/);
    expect(again.errors["lp-1-label"]?.[0]).toMatch(/listed twice/);
  });

  it("reads figures as people type them, with a decimal comma, grouped digits or a unit after them", () => {
    const result = parseComponentForm(
      form(
        componentFields({
          mass: "2,5 t",
          contingencyPct: "7,5 %",
          length: "1 600",
          width: "0,8 m",
          height: "35.4 in",
          cogZ: "400,5",
          "lp-0-engagement": "1.2 in",
          "part-0-name": "Rotor",
          "part-0-mass": "1.240,5 kg",
          "part-0-x": "0",
          "part-0-y": "0",
          "part-0-z": "40 cm",
        }),
      ),
      "metric",
    );
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.data.massKg).toBe(2500);
    expect(result.data.contingencyPct).toBe(7.5);
    expect(result.data.lengthM).toBeCloseTo(1.6, 12);
    expect(result.data.widthM).toBeCloseTo(0.8, 12);
    expect(result.data.heightM).toBeCloseTo(0.89916, 12); // 35.4 x 25.4 mm
    expect(result.data.cog.z).toBeCloseTo(0.4005, 12);
    expect(result.data.liftPoints[0]!.engagementMm).toBeCloseTo(30.48, 9);
    expect(result.data.parts[0]).toMatchObject({ massKg: 1240.5, position: { z: expect.closeTo(0.4, 12) } });
  });

  it("an imperial user may type metric figures with their unit", () => {
    const result = parseComponentForm(
      form(
        componentFields({
          mass: "2000 kg",
          length: "1600 mm",
          width: "31.5",
          height: "35.4",
          cogZ: "15.75",
          "lp-0-x": "-800 mm",
          "lp-0-z": "35.4",
          "lp-1-x": "7.9",
          "lp-1-z": "35.4",
          "lp-0-engagement": "30 mm",
        }),
      ),
      "imperial",
    );
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.data.massKg).toBe(2000);
    expect(result.data.lengthM).toBeCloseTo(1.6, 12);
    expect(result.data.widthM).toBeCloseTo(0.8001, 12); // 31.5 in
    expect(result.data.liftPoints[0]!.position.x).toBeCloseTo(-0.8, 12);
    expect(result.data.liftPoints[0]!.engagementMm).toBeCloseTo(30, 12);
  });

  it("refuses a figure that reads two ways, or a unit of the wrong kind, beside its field and changes nothing else", () => {
    const result = parseComponentForm(
      form(componentFields({ mass: "2,000", length: "1600 kg", "lp-0-engagement": "3 ton", "lp-1-x": "1.2,5" })),
      "metric",
    );
    expect(result).toEqual({
      ok: false,
      errors: {
        mass: ["“2,000” could mean 2000 or 2: type 2000 or 2 to say which."],
        length: ["“kg” is a unit of mass: give the length in mm, m, in or ft."],
        "lp-0-engagement": ["“ton” is a unit of mass: give the length in mm, m, in or ft."],
        "lp-1-x": ["“1.2,5” groups its digits unevenly; group them in threes (1,240,000) or not at all."],
      },
    });
  });

  it("takes a custom outline and refuses a broken one with the line number", () => {
    const ok = parseComponentForm(
      form(
        componentFields({
          outlineMode: "custom",
          outlineElevation: "-800, 0\n800, 0\n800, 900\n-800,900",
          outlinePlan: "-800 -400\n800 -400\n0 400",
        }),
      ),
      "metric",
    );
    expect(ok.ok).toBe(true);
    expect(parsePolygon("1, 2\n3\n4, 5")).toBe('Line 2 should hold two numbers, like "-600, 0".');
    expect(parsePolygon("1, 2\n3, 4")).toMatch(/at least three corners/);
  });

  it("ignores empty rows and keeps the order of the indices", () => {
    const fd = form({ "lp-3-label": "C", "lp-1-label": "A", "lp-2-label": "", "lp-2-x": " " });
    expect(indexedRows(fd, "lp").map((r) => r.values.label)).toEqual(["A", "C"]);
  });

  it("keeps a fit tolerance with its source, leaves it null when blank, and refuses a bad one", () => {
    const given = parseComponentForm(
      form(componentFields({ fitTolerance: "0,5°", fitToleranceSource: "Drawing GB-220 note 4" })),
      "metric",
    );
    expect(given.ok && [given.data.fitToleranceDeg, given.data.fitToleranceSource]).toEqual([
      0.5,
      "Drawing GB-220 note 4",
    ]);
    const blank = parseComponentForm(form(componentFields()), "metric");
    expect(blank.ok && blank.data.fitToleranceDeg).toBeNull();
    for (const [fields, key] of [
      [{ fitTolerance: "0", fitToleranceSource: "drawing" }, "fitTolerance"],
      [{ fitTolerance: "60", fitToleranceSource: "drawing" }, "fitTolerance"],
      [{ fitTolerance: "2 mm", fitToleranceSource: "drawing" }, "fitTolerance"],
      [{ fitTolerance: "1" }, "fitToleranceSource"],
    ] as const) {
      const bad = parseComponentForm(form(componentFields(fields)), "metric");
      expect(bad.ok).toBe(false);
      if (!bad.ok) expect(Object.keys(bad.errors)).toContain(key);
    }
  });
});
