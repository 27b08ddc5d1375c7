// A level lift's computed fix for a leg item over its rating: the hook height at which the same check passes.
import { describe, expect, it } from "vitest";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { fixText } from "~/plans/check-text";
import { handleSolve } from "./api";
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
