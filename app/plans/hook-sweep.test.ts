// The hook-height chart's figures are the checks' own: the plotted load is the design load with
// contingency that the sling-leg and eyebolt checks carry, and "passes from" agrees with the checks.
import { describe, expect, it } from "vitest";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { hookSweep, passesFrom } from "~/plans/hook-sweep";
import { solveLevel } from "~/statics/bridle";
import { checkRigging } from "~/statics/checks";

const UP = { x: 0, y: 0, z: 1 };
const points = [
  { id: "A", position: { x: -0.8, y: 0, z: 0 }, axis: UP, thread: "M16" },
  { id: "B", position: { x: 0.8, y: 0, z: 0 }, axis: UP, thread: "M16" },
];
const rigging = {
  contingencyPct: 10,
  legs: {
    A: {
      eyebolt: { family: "collar" as const, thread: "M16" },
      sling: { kind: "chain" as const, wllKg: 2000, hitch: "straight" as const },
    },
    B: {
      eyebolt: { family: "collar" as const, thread: "M16" },
      sling: { kind: "chain" as const, wllKg: 2000, hitch: "straight" as const },
    },
  },
};
const input = {
  massKg: 800,
  cog: { x: 0, y: 0, z: -0.2 },
  points,
  rigging,
  tables: REFERENCE_TABLES,
  ruleSet: "uk-eu" as const,
};

describe("the hook-height sweep", () => {
  const sweep = hookSweep(input, 0.2, 3.2, 60);

  it("plots the design load with contingency that the checks carry, not the elastic share", () => {
    const p = sweep.points[30]!;
    const r = solveLevel({ massKg: 800, cog: input.cog }, points, p.hookZM);
    if (!r.ok) throw new Error(r.message);
    const checks = checkRigging(r.solution, 800, input.cog, points, rigging, REFERENCE_TABLES, undefined, {});
    const slingA = checks.find((c) => c.id === "sling-leg-A")!;
    expect(p.designLoadKg).toBe(Math.max(...checks.filter((c) => c.kind === "sling-leg").map((c) => c.loadKg!)));
    expect(p.legLoadKg["A"]).toBe(slingA.loadKg);
    expect(p.items["eyebolt-A"]!.capacityKg).toBe(checks.find((c) => c.id === "eyebolt-A")!.capacityKg);
  });
  it("an M16 collar eyebolt (DIN 580: 700 kg axial, 500 kg up to 45 deg) fails low and passes once the hook is high", () => {
    // 800 kg x 1.1 / 2 = 440 kg / cos(beta) a leg against 500 kg: passes once cos(beta) >= 0.88, beta <= 28.4 deg,
    // that is with the hook at least 0.8 / tan(28.4 deg) = 1.48 m up (hand-computed).
    const from = passesFrom(sweep.points, "eyebolt-A");
    expect(from).not.toBeNull();
    expect(from!).toBeGreaterThan(1.47);
    expect(from!).toBeLessThan(1.48 + 0.05 + 1e-9);
    for (const p of sweep.points) {
      expect(p.items["eyebolt-A"]!.verdict).toBe(p.hookZM >= from! ? "pass" : "fail");
    }
  });
  it("a sling leg well within its WLL passes at every height", () => {
    expect(passesFrom(sweep.points, "sling-leg-A")).toBe(sweep.points[0]!.hookZM);
  });
});
