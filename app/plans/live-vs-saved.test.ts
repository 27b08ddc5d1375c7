// The note the editor shows where the server's saved figures and its live ones part. Figures are those of
// one level two-leg lift solved by the core (1000 kg hung from two points 1 m apart, hook 2 m up).
import { describe, expect, it } from "vitest";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { figureDifferences } from "~/plans/live-vs-saved";
import { solveArrangement, type ArrangementInput } from "~/statics/arrangement";
import { checkNeverExamined } from "~/statics/checks-hook";

const input: ArrangementInput = {
  load: { massKg: 1000, cog: { x: 0, y: 0, z: 0 } },
  liftPoints: [
    { id: "A", position: { x: -0.5, y: 0, z: 0.2 }, axis: { x: 0, y: 0, z: 1 } },
    { id: "B", position: { x: 0.5, y: 0, z: 0.2 }, axis: { x: 0, y: 0, z: 1 } },
  ],
  hanging: { kind: "level", hookZM: 2 },
  ruleSet: "uk-eu",
};
const solved = () =>
  JSON.parse(JSON.stringify(solveArrangement(input, REFERENCE_TABLES))) as {
    status: number;
    body: { legs: Array<{ tensionKn: number }>; checks: unknown[] };
  };

describe("figureDifferences", () => {
  it("the same solve differs in nothing", () => {
    expect(figureDifferences(solved(), solved(), "metric")).toEqual([]);
  });

  it("a leg load apart by less than the printed rounding is no difference; one a reader sees is named", () => {
    const live = solved();
    const saved = solved();
    expect(saved.status).toBe(200);
    saved.body.legs[0]!.tensionKn += 1e-7;
    expect(figureDifferences(live, saved, "metric")).toEqual([]);
    saved.body.legs[0]!.tensionKn += 0.5;
    const out = figureDifferences(live, saved, "metric");
    expect(out).toHaveLength(1);
    expect(out[0]).toMatch(/^leg A carries .* kN \(here: .* kN\)$/);
  });

  it("a check only the server has (an item never examined) is named, and it governs", () => {
    const live = solved();
    const saved = solved();
    saved.body.checks.push(
      JSON.parse(
        JSON.stringify(checkNeverExamined("Shackle at A", "SH-99", "2026-12-03", { tables: REFERENCE_TABLES })),
      ),
    );
    const out = figureDifferences(live, saved, "metric");
    expect(out.some((d) => d.startsWith("governing check Shackle at A"))).toBe(true);
    expect(out.some((d) => d.startsWith("the server's checks say Shackle at A"))).toBe(true);
  });

  it("the server refusing what the editor solved says why", () => {
    const saved = { status: 400, body: { error: "The gear allocation is not valid: SH-99 is withdrawn." } };
    expect(figureDifferences(solved(), saved, "metric")).toEqual([
      "the server could not work the plan out: The gear allocation is not valid: SH-99 is withdrawn.",
    ]);
    expect(figureDifferences(saved, saved, "metric")).toEqual([]);
  });
});
