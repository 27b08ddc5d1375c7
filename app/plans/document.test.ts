import { describe, expect, it } from "vitest";
import { rectangleOutlines, type ComponentDefinition } from "~/loads/component-definition";
import { arrangementSchema, detailsSchema, planPutSchema, snapshotIssues } from "~/plans/document";
import { diffComponentDefinitions } from "~/loads/component-changes";
import { defaultArrangement, defaultDetails, defaultSequence, fitToSnapshot } from "~/plans/defaults";

function element(overrides: Partial<ComponentDefinition> = {}): ComponentDefinition {
  return {
    name: "Element",
    description: "",
    massKg: 1480,
    massSource: "certified",
    massNote: "",
    contingencyPct: 3,
    lengthM: 1.3,
    widthM: 0.72,
    heightM: 0.86,
    cog: { x: 0.08, y: 0, z: 0.39 },
    cogSource: "manufacturer",
    cogNote: "",
    ...rectangleOutlines(1.3, 0.72, 0.86),
    liftPoints: [
      {
        label: "A",
        position: { x: -0.45, y: 0, z: 0.86 },
        axis: { x: 0, y: 0, z: 1 },
        thread: "M20",
        engagementMm: 32,
      },
      { label: "B", position: { x: 0.55, y: 0, z: 0.86 }, axis: { x: 0, y: 0, z: 1 }, thread: "M20", engagementMm: 32 },
    ],
    parts: [],
    ...overrides,
  };
}

const level = { kind: "bridle", mode: "level", hookHeightM: 1.8, liftPointLabels: ["A", "B"] };

describe("plan document schemas", () => {
  it("accept a level bridle and fill in the defaults", () => {
    const parsed = arrangementSchema.parse(level);
    expect(parsed.legLengthsM).toEqual({});
  });

  it("refuse what cannot be a lift, each with its own message", () => {
    const cases: Array<[unknown, RegExp]> = [
      [{ ...level, liftPointLabels: [] }, /at least one lift point/],
      [{ ...level, liftPointLabels: ["A", "B", "C", "D", "E"] }, /at most four/],
      [{ ...level, liftPointLabels: ["A", "A"] }, /listed twice/],
      [{ ...level, mode: "lengths" }, /length of the leg to lift point A/],
      [{ ...level, legLengthsM: { Z: 1 } }, /names no lift point/],
      [{ ...level, legLengthsM: { A: 0 } }, /longer than zero/],
      [{ ...level, hookHeightM: Number.POSITIVE_INFINITY }, /hook height/],
      [{ ...level, hookHeightM: 5000 }, /out of range/],
      [{ ...level, kind: "beam" }, /needs the length of its drops/],
      [
        { ...level, kind: "beam", mode: "lengths", beam: { massKg: 50, wllKg: 1000, lengthM: 1, dropLengthM: 0.5 } },
        /use the level mode/,
      ],
      [{ ...level, kind: "crane" }, /"bridle".*"beam"/],
    ];
    for (const [value, message] of cases) {
      const result = arrangementSchema.safeParse(value);
      expect(result.success, JSON.stringify(value)).toBe(false);
      if (!result.success) expect(result.error.issues.map((i) => i.message).join(" ")).toMatch(message);
    }
  });

  it("details: bounds on clearance, people's roles and empty steps", () => {
    const ok = defaultDetails();
    expect(detailsSchema.safeParse(ok).success).toBe(true);
    expect(detailsSchema.safeParse({ ...ok, floorClearanceM: -0.1 }).success).toBe(false);
    expect(detailsSchema.safeParse({ ...ok, floorClearanceM: 51 }).success).toBe(false);
    expect(detailsSchema.safeParse({ ...ok, people: [{ name: "A", role: "captain" }] }).success).toBe(false);
    expect(detailsSchema.safeParse({ ...ok, sequence: [{ title: "  ", holdPoint: false, notes: "" }] }).success).toBe(
      false,
    );
    expect(detailsSchema.safeParse({ ...ok, hazards: [{ hazard: "Swing", control: "" }] }).success).toBe(false);
  });

  it("a PUT drops figures the browser sends, keeping only the editable document", () => {
    const parsed = planPutSchema.parse({
      version: 3,
      title: "Lift",
      arrangement: level,
      rigging: {},
      details: defaultDetails(),
      results: { legs: [] },
    });
    expect(parsed).not.toHaveProperty("results");
    expect(parsed.rigging).toEqual({ legs: {} });
  });
});

describe("default plan", () => {
  it("the sequence trial-lifts and checks level as hold points before travelling (common practice)", () => {
    const steps = defaultSequence();
    const trial = steps.findIndex((s) => /trial lift/i.test(s.title));
    const check = steps.findIndex((s) => /check level/i.test(s.title));
    const travel = steps.findIndex((s) => /travel/i.test(s.title));
    expect(steps[trial]?.holdPoint).toBe(true);
    expect(steps[check]?.holdPoint).toBe(true);
    expect(trial).toBeLessThan(travel);
    expect(check).toBeLessThan(travel);
    expect(steps.filter((s) => s.holdPoint)).toHaveLength(2);
  });

  it("the arrangement puts the hook so the leg farthest from the CoG hangs 30 deg from vertical", () => {
    const def = element();
    const a = defaultArrangement(def);
    expect(a).toMatchObject({ kind: "bridle", mode: "level", liftPointLabels: ["A", "B"] });
    // Farthest lift point A is 0.53 m from the CoG's plumb line: rise 0.53 / tan 30 deg = 0.918 m.
    expect(a.hookHeightM).toBeCloseTo(0.86 + 0.53 / Math.tan(Math.PI / 6), 3);
    const angleA = (Math.atan2(0.53, a.hookHeightM - 0.86) * 180) / Math.PI;
    expect(angleA).toBeLessThanOrEqual(30.01);
  });

  it("takes at most four lift points and rises at least 300 mm over one on the plumb line", () => {
    const five = element({
      liftPoints: ["A", "B", "C", "D", "E"].map((label, i) => ({
        label,
        position: { x: i * 0.1, y: 0, z: 0.8 },
        axis: { x: 0, y: 0, z: 1 },
        thread: "",
        engagementMm: null,
      })),
    });
    expect(defaultArrangement(five).liftPointLabels).toEqual(["A", "B", "C", "D"]);
    const one = element({
      liftPoints: [
        {
          label: "A",
          position: { x: 0.08, y: 0, z: 0.86 },
          axis: { x: 0, y: 0, z: 1 },
          thread: "",
          engagementMm: null,
        },
      ],
    });
    expect(defaultArrangement(one).hookHeightM).toBeCloseTo(1.16, 9);
  });

  it("snapshotIssues names lift points the load does not have and gear on legs not in use", () => {
    const issues = snapshotIssues(
      {
        arrangement: arrangementSchema.parse({ ...level, liftPointLabels: ["A", "Q"] }),
        rigging: { legs: { B: { hitch: "straight" } } },
      },
      element(),
    );
    expect(issues.map((i) => i.message)).toEqual([
      "The load has no lift point Q.",
      "Gear is allocated to leg B, which is not in the arrangement.",
    ]);
  });

  it("fitToSnapshot drops removed lift points and falls back to the default when none are left", () => {
    const doc = {
      arrangement: arrangementSchema.parse({ ...level, mode: "lengths", legLengthsM: { A: 1, B: 1 } }),
      rigging: { legs: { A: { hitch: "straight" as const }, B: { hitch: "straight" as const } } },
    };
    const onlyA = element({ liftPoints: element().liftPoints.slice(0, 1) });
    const fitted = fitToSnapshot(doc, onlyA);
    expect(fitted.arrangement.liftPointLabels).toEqual(["A"]);
    expect(fitted.arrangement.legLengthsM).toEqual({ A: 1 });
    expect(Object.keys(fitted.rigging.legs)).toEqual(["A"]);
    const other = element({ liftPoints: [{ ...element().liftPoints[0]!, label: "X" }] });
    expect(fitToSnapshot(doc, other).arrangement).toEqual(defaultArrangement(other));
  });
});

describe("diffComponentDefinitions", () => {
  it("finds nothing between a definition and itself", () => {
    expect(diffComponentDefinitions(element(), element())).toEqual([]);
  });

  it("reports mass, CoG, dimensions and lift points added, removed, moved and re-threaded", () => {
    const before = element();
    const after = element({
      massKg: 1520,
      cog: { x: 0.1, y: 0, z: 0.39 },
      lengthM: 1.35,
      liftPoints: [
        { ...before.liftPoints[0]!, position: { x: -0.5, y: 0, z: 0.86 }, thread: "M24" },
        {
          label: "C",
          position: { x: 0, y: 0.3, z: 0.86 },
          axis: { x: 0, y: 0, z: 1 },
          thread: "M20",
          engagementMm: null,
        },
      ],
    });
    const changes = diffComponentDefinitions(before, after);
    expect(changes.map((c) => c.kind)).toEqual([
      "mass",
      "cog",
      "dimensions",
      "lift-point-moved",
      "lift-point-thread",
      "lift-point-added",
      "lift-point-removed",
    ]);
    expect(changes.find((c) => c.kind === "mass")?.message).toBe("Mass 1,480 kg → 1,520 kg.");
    expect(changes.find((c) => c.kind === "cog")?.message).toMatch(/CoG moved 20 mm/);
    expect(changes.find((c) => c.kind === "lift-point-moved")?.message).toMatch(/Lift point A moved 50 mm/);
    expect(changes.find((c) => c.kind === "lift-point-removed")?.message).toBe("Lift point B removed.");
  });

  it("ignores differences below half a millimetre (unit conversion noise)", () => {
    const after = element({ cog: { x: 0.0801, y: 0, z: 0.39 } });
    expect(diffComponentDefinitions(element(), after)).toEqual([]);
  });
});
