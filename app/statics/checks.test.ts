// Checks against working load limits: each rule, with the source it comes from.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { solveLevel, type LegResult, type LiftPoint } from "./bridle";
import {
  checkCraneLoad,
  checkEyebolt,
  checkHeadroom,
  checkInspection,
  checkLegAngle,
  checkMasterLink,
  checkRigging,
  checkShackle,
  checkSharedShackle,
  checkSlingAssembly,
  checkSlingLeg,
  isoDateToDay,
} from "./checks";
import { ceilTo } from "./units";
import { checkSentence } from "~/plans/check-text";

const T = REFERENCE_TABLES;
const UP = { x: 0, y: 0, z: 1 };
const lp = (id: string, x: number, y: number, z: number): LiftPoint => ({ id, position: { x, y, z }, axis: UP });

describe("leg angle limits (29 CFR 1910.184(b); OSHA Guidance on Safe Sling Use; EN 818-6 practice)", () => {
  it.each([
    [0, "pass", "vertical"],
    [5, "pass", "vertical"],
    [5.1, "pass", "up to 45"],
    [45, "pass", "up to 45"],
    [45.1, "warn", "45-60"],
    [60, "warn", "45-60"],
    [60.1, "fail", "over 60"],
  ] as const)("beta %d deg -> %s (%s)", (beta, status, rule) => {
    const c = checkLegAngle("A", beta);
    expect(c.verdict).toBe(status);
    expect(c.rule.toLowerCase()).toContain(
      rule === "vertical" ? "vertical" : rule === "up to 45" ? "up to 45" : rule === "45-60" ? "45-60" : "over 60",
    );
    expect(checkSentence(c, "metric")).toContain("Sling leg A");
  });
});

describe("sling legs: WLL x hitch factor (EN 818-4 / EN 13414-1 / EN 1492-1)", () => {
  it("8 mm grade 8 chain (2.0 t, EN 818-4 table) in choke (0.8) is good for 1600 kg", () => {
    const spec = { kind: "chain" as const, diameterMm: 8, hitch: "choke" as const };
    expect(checkSlingLeg("A", 1600, spec, T).verdict).toBe("pass");
    const over = checkSlingLeg("A", 1700, spec, T);
    expect(over.verdict).toBe("fail");
    expect(over.capacityKg).toBeCloseTo(1600, 9);
    expect(over.utilisation).toBeCloseTo(1.0625, 12);
    expect(over.item).toBe("Sling leg A (chain 8 mm, choke hitch)");
  });
  it("a stated WLL in short tons converts exactly (2 short tons = 1814.36948 kg)", () => {
    const c = checkSlingLeg("B", 1000, { kind: "wire", wll: { value: 2, unit: "shortTon" }, hitch: "straight" }, T);
    expect(c.capacityKg).toBeCloseTo(1814.36948, 6);
  });
  it("a sling with no WLL and no size fails and says what to give", () => {
    const c = checkSlingLeg("C", 10, { kind: "round", hitch: "straight" }, T);
    expect(c.verdict).toBe("fail");
    expect(checkSentence(c, "metric")).toMatch(/state its marked WLL/);
  });
});

describe("multi-leg rating (uniform load method; DGUV Regel 100-500; NAVEDTRA)", () => {
  const chain8 = { kind: "chain" as const, diameterMm: 8, hitch: "straight" as const };
  it("symmetric 2-leg 8 mm chain up to 45 deg: 2.0 t x 1.4 = 2.8 t (EN 818-4 table 2.8 t)", () => {
    expect(checkSlingAssembly(2800, [chain8, chain8], 2, 40, "sym.", T).capacityKg).toBeCloseTo(2800, 9);
    expect(checkSlingAssembly(2801, [chain8, chain8], 2, 40, "sym.", T).verdict).toBe("fail");
  });
  it("2-leg 45-60 deg: x 1.0 (EN 818-4 table 2.0 t)", () => {
    expect(checkSlingAssembly(1000, [chain8, chain8], 2, 50, "sym.", T).capacityKg).toBeCloseTo(2000, 9);
  });
  it("asymmetric 2-leg Furley example is rated as 1 leg carrying (DGUV Regel 100-500)", () => {
    const r = solveLevel(
      { massKg: 2000, cog: { x: 0, y: 0, z: -0.1 } },
      [lp("A", -0.2, 0, 0), lp("B", 0.8, 0, 0)],
      0.8,
    );
    if (!r.ok) throw new Error(r.message);
    expect(r.solution.rating.effectiveLegs).toBe(1);
    const c = checkSlingAssembly(
      2000,
      [chain8, chain8],
      r.solution.rating.effectiveLegs,
      r.solution.rating.maxAngleFromVerticalDeg,
      r.solution.rating.rule,
      T,
    );
    expect(c.capacityKg).toBeCloseTo(2000, 9);
    expect(c.rule).toContain("1 leg");
  });
  it("a leg beyond 60 deg leaves the sling without a rating", () => {
    const c = checkSlingAssembly(100, [chain8, chain8], 2, 61, "sym.", T);
    expect(c.verdict).toBe("fail");
    expect(checkSentence(c, "metric")).toContain("beyond 60°");
  });
  it("3/4 legs carrying as 3: 16 mm chain up to 60 deg is capped at the published 11.8 t (EN 818-4 table) below 8 x 1.5 = 12 t", () => {
    const c16 = { kind: "chain" as const, diameterMm: 16, hitch: "straight" as const };
    expect(checkSlingAssembly(100, [c16, c16, c16, c16], 3, 55, "sym.", T).capacityKg).toBeCloseTo(11800, 9);
  });
});

describe("eyebolts (DIN 580; ASME B18.15-type table; ASME B30.26)", () => {
  it("thread must match the lift point (common practice)", () => {
    const c = checkEyebolt("A", 100, 0, { family: "collar", thread: "M16" }, "M20", T);
    expect(c.verdict).toBe("fail");
    expect(checkSentence(c, "metric")).toContain("use an M20 eyebolt");
  });
  it("angled pull out of the plane of the eye fails", () => {
    expect(
      checkEyebolt("A", 100, 30, { family: "collar", thread: "M16", eyeAlignedWithPull: false }, "M16", T).verdict,
    ).toBe("fail");
    expect(
      checkEyebolt("A", 100, 30, { family: "shoulder", thread: "M16", wllKg: 700, eyeAlignedWithPull: false }, "M16", T)
        .verdict,
    ).toBe("fail");
  });
  it("pull beyond 90 deg from the axis fails", () => {
    expect(checkEyebolt("A", 1, 95, { family: "collar", thread: "M16" }, "M16", T).verdict).toBe("fail");
  });
  it("M16 collar axial 700 kg (DIN 580): 700 passes, 701 fails", () => {
    expect(checkEyebolt("A", 700, 0, { family: "collar", thread: "M16" }, "M16", T).verdict).toBe("pass");
    expect(checkEyebolt("A", 701, 0, { family: "collar", thread: "M16" }, "M16", T).verdict).toBe("fail");
  });
  it("a collar eyebolt marked below the DIN 580 value is derated from its marking", () => {
    expect(checkEyebolt("A", 1, 50, { family: "collar", thread: "M16", wllKg: 350 }, "M16", T).capacityKg).toBeCloseTo(
      175,
      9,
    );
  });
  it("unrecorded lift point thread turns a pass into a warning", () => {
    expect(checkEyebolt("A", 100, 0, { family: "collar", thread: "M16" }, undefined, T).verdict).toBe("warn");
  });
  it("shoulder and plain eyebolts need a marked WLL", () => {
    expect(checkEyebolt("A", 100, 0, { family: "shoulder", thread: "M16" }, "M16", T).verdict).toBe("fail");
    expect(checkEyebolt("A", 100, 0, { family: "plain", thread: "M16" }, "M16", T).verdict).toBe("fail");
  });
});

describe("shackles (side load and included angle: common practice across rigging hardware guidance)", () => {
  it("in-line 2 t bow shackle takes 2000 kg; 45 deg side load 1400 kg", () => {
    expect(checkShackle("A", 2000, { type: "bow", wllKg: 2000 }, T).verdict).toBe("pass");
    expect(checkShackle("A", 1500, { type: "bow", wllKg: 2000, sideLoadAngleDeg: 45 }, T).verdict).toBe("fail");
  });
  const leg = (id: string, halfAngleDeg: number, sign: number): LegResult => {
    const a = (halfAngleDeg * Math.PI) / 180;
    return {
      liftPointId: id,
      lengthM: 1,
      tensionKn: 9.80665,
      tensionKg: 1000,
      angleFromVerticalDeg: halfAngleDeg,
      axisAngleDeg: halfAngleDeg,
      verticalShare: 0.5,
      slack: false,
      direction: { x: -sign * Math.sin(a), y: 0, z: Math.cos(a) },
    };
  };
  it("two legs 120 deg apart on one shackle pass; 130 deg fails", () => {
    const ok = checkSharedShackle(0, leg("A", 60, 1), leg("B", 60, -1), 1, { legIds: ["A", "B"], wllKg: 3250 });
    expect(ok.verdict).toBe("pass");
    // Resultant of two 1000 kg legs 120 deg apart is 1000 kg (vector sum).
    expect(ok.loadKg).toBeCloseTo(1000, 9);
    expect(
      checkSharedShackle(0, leg("A", 65, 1), leg("B", 65, -1), 1, { legIds: ["A", "B"], wllKg: 3250 }).verdict,
    ).toBe("fail");
  });
});

describe("master link, crane and headroom (LOLER reg 8; ASME P30.1)", () => {
  it("master link and crane compare the hook load with WLL / SWL", () => {
    expect(checkMasterLink(3000, { wll: { value: 3.15, unit: "t" } }).verdict).toBe("pass");
    expect(checkCraneLoad(5001, { swlKg: 5000 }).verdict).toBe("fail");
    expect(checkMasterLink(1, {}).verdict).toBe("fail");
  });
  it("headroom: needed hook height against the hook's highest position", () => {
    expect(checkHeadroom(5.2, 5.5).verdict).toBe("pass");
    expect(checkHeadroom(5.6, 5.5).verdict).toBe("fail");
  });
});

describe("inspection status (UK LOLER 1998 reg 9(3))", () => {
  const rec = (status: "in_service" | "quarantined" | "withdrawn", due: string) => ({
    itemId: "SL-1",
    status,
    examinationDue: due,
  });
  it.each([
    [rec("in_service", "2025-12-31"), "2025-06-01", "pass"],
    [rec("in_service", "2025-06-20"), "2025-06-01", "warn"],
    [rec("in_service", "2025-06-01"), "2025-06-01", "warn"],
    [rec("in_service", "2025-05-31"), "2025-06-01", "fail"],
    [rec("quarantined", "2026-01-01"), "2025-06-01", "fail"],
    [rec("withdrawn", "2026-01-01"), "2025-06-01", "fail"],
    [rec("in_service", "2025-02-30"), "2025-06-01", "fail"],
  ] as const)("%o on %s -> %s", (record, today, status) => {
    expect(checkInspection("Sling leg A", record, today).verdict).toBe(status);
  });
  it("dates count in whole days", () => expect(isoDateToDay("1970-01-02")).toBe(1));
  it("an item in date today but due before the planned lift date fails, showing both dates", () => {
    const c = checkInspection("Sling leg A", rec("in_service", "2025-07-01"), "2025-05-01", {
      liftDateIso: "2025-07-15",
    });
    expect(c.verdict).toBe("fail");
    expect(c.finding).toBe("overdue-at-lift");
    expect(c.fix).toEqual({ kind: "examine-before", dateIso: "2025-07-15" });
    expect(c.inputs.inspection).toMatchObject({ daysLeftToday: 61, daysLeftAtLift: -14 });
    expect(checkSentence(c, "metric")).toContain("today 2025-05-01; lift planned for 2025-07-15");
    expect(
      checkInspection("Sling leg A", rec("in_service", "2025-07-01"), "2025-05-01", { liftDateIso: "2025-06-30" })
        .verdict,
    ).toBe("pass");
  });
});

describe("checkRigging on the Furley 2-leg example with 10 % contingency", () => {
  const r = solveLevel({ massKg: 2000, cog: { x: 0, y: 0, z: -0.1 } }, [lp("A", -0.2, 0, 0), lp("B", 0.8, 0, 0)], 0.8);
  if (!r.ok) throw new Error(r.message);
  const checks = checkRigging(
    r.solution,
    2000,
    { x: 0, y: 0, z: -0.1 },
    [
      { id: "A", thread: "M24" },
      { id: "B", thread: "M24" },
    ],
    {
      legs: {
        A: { sling: { kind: "chain", diameterMm: 8, hitch: "straight" }, eyebolt: { family: "collar", thread: "M24" } },
        B: { sling: { kind: "chain", diameterMm: 8, hitch: "straight" }, eyebolt: { family: "collar", thread: "M24" } },
      },
      masterLink: { wllKg: 3150 },
      crane: { swlKg: 2500, maxHookHeightM: 4 },
      headroom: { clearanceAboveFloorM: 2.5, loadUndersideZM: -0.4 },
      contingencyPct: 10,
      riggingMassKg: 40,
    },
    T,
  );
  const byId = new Map(checks.map((c) => [c.id, c]));
  it("leg A carries 1649.2 kg x 1.1 (Furley Engineering tension, contingency applied)", () => {
    expect(byId.get("sling-leg-A")!.loadKg).toBeCloseTo(1649.242 * 1.1, 2);
  });
  it("eyebolt B at 45 deg uses the DIN 580 up-to-45 column, 1290 kg for M24", () => {
    expect(byId.get("eyebolt-B")!.capacityKg).toBe(1290);
  });
  it("crane gross load = 2000 x 1.1 + 40 = 2240 kg", () => expect(byId.get("crane-load")!.loadKg).toBeCloseTo(2240, 9));
  it("headroom needed = 2.5 m + (0.8 - (-0.4)) m = 3.7 m", () =>
    expect(byId.get("crane-headroom")!.utilisation).toBeCloseTo(3.7 / 4, 12));
  it("asymmetric 2-leg sling rated as 1 leg: 2200 kg on 2000 kg fails", () =>
    expect(byId.get("sling-assembly")!.verdict).toBe("fail"));
  it("every check names its item and has a source", () => {
    for (const c of checks) {
      expect(c.item.length).toBeGreaterThan(0);
      expect(c.source.length).toBeGreaterThan(0);
      expect(checkSentence(c, "metric")).toContain(c.item.split(" (")[0]!.split(" ")[0]!);
    }
  });
});

describe("ceilTo never rounds down", () => {
  it("examples", () => {
    expect(ceilTo(0.3, 2)).toBe(0.3);
    expect(ceilTo(0.30001, 2)).toBe(0.31);
    expect(ceilTo(0.9999, 2)).toBe(1);
    expect(ceilTo(1.0000001, 3)).toBe(1.001);
  });
  it("ceilTo(x, d) >= x for any x in [0, 100] and d in 0..4 (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 100, noNaN: true }), fc.integer({ min: 0, max: 4 }), (x, d) => {
        const y = ceilTo(x, d);
        expect(y).toBeGreaterThanOrEqual(x - 1e-12 * Math.max(1, x));
        expect(y - x).toBeLessThanOrEqual(10 ** -d + 1e-12);
      }),
      { numRuns: 300 },
    );
  });
});
