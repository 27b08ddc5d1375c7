// A level lift's computed fix for a leg item over its rating: the hook height at which the same check passes.
import { describe, expect, it } from "vitest";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { fixText } from "~/plans/check-text";
import { handleSolve } from "./api";
import { solveLevel } from "./bridle";
import { checkLegItem, checkRigging } from "./checks";
import { lowestPassingHookZ } from "./raise-hook";

const body = (hookZM: number) => ({
  load: { massKg: 800, cog: { x: 0, y: 0, z: -0.2 } },
  liftPoints: [
    { id: "A", x: -0.8, y: 0, z: 0, thread: "M16" },
    { id: "B", x: 0.8, y: 0, z: 0, thread: "M16" },
  ],
  hook: { z: hookZM },
  rigging: {
    contingencyPct: 10,
    legs: { A: { eyebolt: { family: "collar", thread: "M16" } }, B: { eyebolt: { family: "collar", thread: "M16" } } },
  },
});

describe("raise the hook to at least N mm (computed)", () => {
  it("M16 collar eyebolts (DIN 580: 500 kg up to 45 deg) under 800 kg x 1.1 on legs 0.8 m out pass from 1,482.2 mm", () => {
    // 440 kg / cos(beta) <= 500 kg: cos(beta) >= 0.88, hook at least 0.8 x 0.88 / sqrt(1 - 0.88^2) = 1.48221 m (hand-computed).
    const res = handleSolve(body(0.6), REFERENCE_TABLES);
    if (res.status !== 200) throw new Error(JSON.stringify(res.body));
    const eyebolt = res.body.checks!.find((c) => c.id === "eyebolt-A")!;
    expect(eyebolt.verdict).toBe("fail");
    expect(eyebolt.fix).toMatchObject({ kind: "tapped-size-limit", thread: "M16" });
    const z = (eyebolt.fix as { orRaiseHookToZM?: number }).orRaiseHookToZM!;
    expect(z).toBeCloseTo((0.8 * 0.88) / Math.sqrt(1 - 0.88 * 0.88), 5);
    expect(fixText(eyebolt.fix!, "metric")).toMatch(/or raise the hook point to at least 1,483 mm/);
    // Applying the fix: at that height the same check passes.
    const raised = handleSolve(body(z), REFERENCE_TABLES);
    if (raised.status !== 200) throw new Error("solve failed");
    expect(raised.body.checks!.find((c) => c.id === "eyebolt-A")!.verdict).toBe("pass");
  });
  it("no height passes: no hook fix", () => {
    expect(lowestPassingHookZ(() => false, 1, 5)).toBeNull();
  });
  it("finds the first passing height to within a micrometre", () => {
    expect(lowestPassingHookZ((z) => z >= 2.345678, 1, 5)).toBeCloseTo(2.345678, 6);
  });
});

describe("the search's one-item check", () => {
  // Common practice: a four-leg bridle with a sling, shackle and eyebolt on every leg, off-centre CoG.
  const load = { massKg: 3200, cog: { x: 0.15, y: -0.1, z: -0.3 } };
  const up = { x: 0, y: 0, z: 1 };
  const points = [
    { id: "A", position: { x: -0.9, y: -0.6, z: 0 }, axis: up, thread: "M20" },
    { id: "B", position: { x: 0.9, y: -0.6, z: 0 }, axis: up, thread: "M20" },
    { id: "C", position: { x: 0.9, y: 0.6, z: 0 }, axis: up, thread: "M20" },
    { id: "D", position: { x: -0.9, y: 0.6, z: 0.2 }, axis: { x: 1, y: 0, z: 0 }, thread: "M20" },
  ];
  const leg = (wllKg: number) => ({
    sling: { kind: "chain" as const, diameterMm: 8, hitch: "straight" as const, wllKg },
    shackle: { type: "bow" as const, wllKg: wllKg * 0.8 },
    eyebolt: { family: "collar" as const, thread: "M20" },
  });
  const rigging = { contingencyPct: 10, legs: { A: leg(2000), B: leg(1000), C: leg(1500), D: leg(800) } };

  it("is the very check checkRigging gives, field for field, at every hook height of a sweep", () => {
    const ids = points.flatMap((p) => [`sling-leg-${p.id}`, `shackle-${p.id}`, `eyebolt-${p.id}`]);
    let compared = 0;
    for (let z = 0.3; z <= 4; z += 0.1) {
      const level = solveLevel(load, points, z);
      if (!level.ok) continue;
      const all = checkRigging(level.solution, load.massKg, load.cog, points, rigging, REFERENCE_TABLES, "2026-01-05");
      for (const id of ids) {
        const want = all.find((c) => c.id === id);
        expect(want).toBeDefined();
        expect(checkLegItem(level.solution, points, rigging, REFERENCE_TABLES, id)).toEqual(want);
        compared++;
      }
      // Not a leg item's check: nothing.
      expect(checkLegItem(level.solution, points, rigging, REFERENCE_TABLES, "angle-A")).toBeUndefined();
    }
    expect(compared).toBeGreaterThan(300);
  });
});
