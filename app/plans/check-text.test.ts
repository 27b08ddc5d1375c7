// Checks in words: the user's units, loads rounded up, capacities rounded down, utilisation never rounded down.
import { describe, expect, it } from "vitest";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { checkCraneLoad, checkLegAngle, checkShackle, checkSlingLeg } from "~/statics/checks";
import { toCheckResult } from "~/statics/response";
import { checkSentence, fixText, ruleText, standing, warningSentence, type LegacyCheck } from "~/plans/check-text";
import { governingCheck, marginText } from "~/plans/governing";
import { formatCapacity, formatForce, formatLoad, formatMarkedWll, formatUtilisation } from "~/utils/format";

const T = REFERENCE_TABLES;

describe("one check, two unit systems", () => {
  // 1 t marked WLL, 1200 kg on it: fails; 1 lb = 0.45359237 kg exactly.
  const over = checkSlingLeg("A", 1200, { kind: "web", wll: { value: 1, unit: "t" }, hitch: "straight" }, T);
  it("the imperial sentence is in lb and has no kg", () => {
    const text = checkSentence(over, "imperial");
    expect(text).toContain("lb");
    expect(text).not.toMatch(/\bkg\b/);
    // 1200 kg = 2645.5 lb, rounded up; 1000 kg = 2204.6 lb, rounded down; at least 1200 kg of WLL needed.
    expect(text).toContain("2,646 lb");
    expect(text).toContain("2,204 lb");
  });
  it("the rule line shows the WLL as marked with its converted value beside it", () => {
    expect(ruleText(over, "imperial")).toContain("marked 1 t (2,204 lb)");
    expect(ruleText(over, "metric")).toContain("marked 1 t");
    expect(ruleText(over, "imperial")).not.toMatch(/\bkg\b/);
  });
  it("forces: lbf for imperial users, kN for metric, both rounded up", () => {
    expect(formatForce(16.1816, "metric")).toBe("16.19 kN");
    // 16.1816 kN = 3637.8 lbf (1 lbf = 4.4482216152605 N)
    expect(formatForce(16.1816, "imperial")).toBe("3,638 lbf");
  });
});

describe("rounding with a safety direction", () => {
  it("capacities round down: 1,149.99 kg is good for 1,149 kg, never 1,150", () => {
    expect(formatCapacity(1149.99, "metric")).toBe("1,149 kg");
    expect(formatCapacity(1.15 * 1000, "metric")).toBe("1,150 kg");
  });
  it("loads round up: 1,649.2 kg shows as 1,650 kg (Furley Engineering near leg)", () => {
    expect(formatLoad(1649.242, "metric")).toBe("1,650 kg");
    expect(formatLoad(7.41, "metric")).toBe("7.5 kg");
  });
  it("a capacity of 1,149.99 kg in the sentence", () => {
    const c = checkCraneLoad(1200, { swlKg: 1149.99 });
    expect(checkSentence(c, "metric")).toContain("good for only 1,149 kg SWL");
  });
  it("utilisation is never rounded down and appears once", () => {
    expect(formatUtilisation(0.1401)).toBe("15 %");
    expect(formatUtilisation(1)).toBe("100 %");
    expect(formatUtilisation(Infinity)).toBe("no capacity");
    expect(formatUtilisation(null)).toBe("—");
    const c = checkSlingLeg("A", 300, { kind: "web", wllKg: 2000, hitch: "straight" }, T);
    expect(checkSentence(c, "metric")).not.toContain("%");
    expect(checkSentence(c, "metric", { withUtilisation: true }).match(/15 %/g)).toHaveLength(1);
  });
  it("a WLL marked in kg is shown as marked to a metric user, and with lb beside it to an imperial one", () => {
    expect(formatMarkedWll({ value: 700, unit: "kg" }, "metric")).toBe("700 kg");
    expect(formatMarkedWll({ value: 700, unit: "kg" }, "imperial")).toBe("700 kg (1,543 lb)");
    expect(formatMarkedWll({ value: 3.25, unit: "shortTon" }, "metric")).toBe("3.25 US ton (2,948 kg)");
  });
});

describe("fixes in words", () => {
  it("raise the hook, rounded up in the user's length unit", () => {
    expect(fixText({ kind: "raise-hook", minHookZM: 0.57735 }, "metric")).toContain("at least 578 mm");
    expect(fixText({ kind: "raise-hook", minHookZM: 0.57735 }, "imperial")).toContain("at least 22.74 in");
  });
  it("an angle check that fails says so with the rule set's limit and the fix", () => {
    const c = checkLegAngle("A", 70, { fix: { warn: null, fail: { kind: "raise-hook", minHookZM: 1.2 } } });
    expect(checkSentence(c, "metric")).toMatch(
      /70\.0° from vertical .*beyond 60°: raise the hook point to at least 1,200 mm/,
    );
  });
  it("a shackle side-loaded from the geometry says where the angle came from", () => {
    const c = checkShackle("A", 500, { type: "bow", wllKg: 2000 }, T, {
      sideLoad: { angleDeg: 30, from: "lug-plane" },
    });
    expect(checkSentence(c, "metric")).toContain("Side load 30.0°, from the pull against the lug's plane");
  });
});

describe("governing check and stored results", () => {
  const pass = checkSlingLeg("A", 300, { kind: "web", wllKg: 2000, hitch: "straight" }, T);
  const fail = checkSlingLeg("B", 2500, { kind: "web", wllKg: 2000, hitch: "straight" }, T);
  it("the worst verdict governs, with its margin and fix", () => {
    const g = governingCheck([pass, fail], "metric")!;
    expect(g.check.id).toBe("sling-leg-B");
    expect(g.marginKg).toBeCloseTo(-500, 9);
    expect(marginText(g.marginKg!, "metric")).toBe("over by 500 kg");
    expect(g.fix).toBe("use a sling with a single-leg WLL of at least 2,500 kg");
  });
  it("a check stored before checks were structured shows its stored sentence", () => {
    const legacy: LegacyCheck = {
      id: "master-link",
      item: "Master link",
      status: "pass",
      utilisation: 0.5,
      loadKg: 1000,
      capacityKg: 2000,
      rule: "Total hook load vs WLL",
      source: "marked WLL",
      message: "Master link carries 1,000 kg of its 2,000 kg WLL (50 %).",
    };
    expect(checkSentence(legacy, "imperial")).toBe(legacy.message);
    expect(governingCheck([legacy], "metric")!.verdict).toBe("pass");
  });
  it("the API adds the older status and a metric message to each check", () => {
    const wire = toCheckResult(fail);
    expect(wire.status).toBe("fail");
    expect(wire.message).toContain("2,500 kg");
    expect(wire.message).toContain("(125 %)");
  });
});

describe("a plan with no gear allocated is not yet checked", () => {
  const angle = (leg: string, status: "pass" | "warn" | "fail") => ({
    id: `angle-${leg}`,
    item: `Sling leg ${leg}`,
    status,
    utilisation: null,
    loadKg: null,
    capacityKg: null,
    rule: "angle from vertical",
    source: "common practice",
    message: "",
  });
  const eyebolt = (leg: string, status: "pass" | "warn" | "fail") => ({ ...angle(leg, status), id: `eyebolt-${leg}` });

  it("angle passes alone never read as a pass, for the plan or a leg", () => {
    expect(standing([angle("A", "pass"), angle("B", "pass")])).toBe("unchecked");
    expect(standing([angle("A", "pass")], "A")).toBe("unchecked");
  });
  it("an angle that warns or fails shows at once, gear or not", () => {
    expect(standing([angle("A", "pass"), angle("B", "fail")])).toBe("fail");
    expect(standing([angle("B", "warn")], "B")).toBe("warn");
  });
  it("once gear is checked the worst verdict stands", () => {
    expect(standing([angle("A", "pass"), eyebolt("A", "pass")])).toBe("pass");
    expect(standing([angle("A", "pass"), eyebolt("A", "fail")], "A")).toBe("fail");
    expect(standing([angle("A", "pass"), eyebolt("B", "pass")], "A")).toBe("unchecked");
  });
});

describe("the fixes for tilt and a tapped size, in words", () => {
  it("levelling legs: shorten and lengthen with the leg named, in mm or in (1 in = 25.4 mm exactly)", () => {
    const fix = {
      kind: "level-legs" as const,
      legs: [
        { legId: "C", changeM: -0.012 },
        { legId: "A", changeM: 0.0254 },
      ],
    };
    expect(fixText(fix, "metric")).toBe("shorten leg C by 12 mm and lengthen leg A by 25 mm to hang the load level");
    expect(fixText(fix, "imperial")).toContain("shorten leg C by 0.47 in");
  });
  it("an eyebolt that fills its tapped hole asks for a lifting point of higher WLL on that thread, or more legs", () => {
    const text = fixText({ kind: "tapped-size-limit", thread: "M20", minWllKg: 1234.2 }, "metric");
    expect(text).toBe(
      "eyebolt M20 is the tapped size: use a lifting point of higher WLL (at least 1,235 kg in line) or more legs",
    );
  });
});

describe("a solver's warning in the reader's units", () => {
  const fourLegs = {
    message: "Rate each leg for its design tension, up to 1190 kg: 4-leg sling, not symmetric.",
  };

  it("keeps the metric sentence and writes loads in lb, rounded up (1 lb = 0.45359237 kg exact, NIST SP 811)", () => {
    expect(warningSentence(fourLegs, "metric")).toBe(fourLegs.message);
    // 1190 / 0.45359237 = 2623.5 lb, rounded up: never a smaller load than the metric figure.
    expect(warningSentence(fourLegs, "imperial")).toBe(
      "Rate each leg for its design tension, up to 2,624 lb: 4-leg sling, not symmetric.",
    );
  });
});
