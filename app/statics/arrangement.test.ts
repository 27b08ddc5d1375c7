// One entry for every arrangement: /api/solve's bodies and a plan's own types reach the same answer.
import { describe, expect, it } from "vitest";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { handleSolve, solveBodySchema, toArrangementInput, toSolveBody } from "./api";
import { solveArrangement, type ArrangementInput } from "./arrangement";

// Furley Engineering 'Sling Load' worked example: 2000 kg, legs at -0.2 m and +0.8 m, hook 0.8 m up.
const furley = {
  load: { massKg: 2000, cog: { x: 0, y: 0, z: -0.1 } },
  liftPoints: [
    { id: "A", x: -0.2, y: 0, z: 0, thread: "M20" },
    { id: "B", x: 0.8, y: 0, z: 0 },
  ],
  hook: { z: 0.8 },
};

describe("solveArrangement is the entry /api/solve calls", () => {
  it("a parsed body solved directly answers exactly as the API does (1649.2 kg and 565.7 kg, Furley)", () => {
    const api = handleSolve(furley, REFERENCE_TABLES, { todayIso: "2026-01-05" });
    const input = toArrangementInput(solveBodySchema.parse(furley), { todayIso: "2026-01-05" });
    const direct = solveArrangement(input, REFERENCE_TABLES);
    expect(direct).toEqual(api);
    expect(direct.status).toBe(200);
    if (direct.status !== 200) return;
    expect(direct.body.legs.map((l) => l.tensionKg)).toEqual([expect.closeTo(1649.2, 1), expect.closeTo(565.7, 1)]);
  });

  it("a bridle's input turned back into a body solves the same, level or given lengths", () => {
    for (const hanging of [{ hook: { z: 0.8 } }, { legLengths: { A: 0.85, B: 1.15 } }]) {
      const body = { load: furley.load, liftPoints: furley.liftPoints, ...hanging };
      const input = toArrangementInput(solveBodySchema.parse(body));
      const again = toSolveBody(input);
      expect(again).not.toBeNull();
      expect(handleSolve(again, REFERENCE_TABLES)).toEqual(handleSolve(body, REFERENCE_TABLES));
    }
  });

  it("the API takes no beam: a beam's input has no body", () => {
    const input: ArrangementInput = {
      load: { massKg: 2000, cog: { x: 0, y: 0, z: 0 } },
      liftPoints: [],
      hanging: { kind: "beam", hookZM: 3, beam: { massKg: 100, wllKg: 5000, lengthM: 3, dropLengthM: 1 } },
      ruleSet: "uk-eu",
    };
    expect(toSolveBody(input)).toBeNull();
  });
});

describe("a beam goes through the same entry", () => {
  const up = { x: 0, y: 0, z: 1 };
  const beamInput = (cogX: number): ArrangementInput => ({
    load: { massKg: 2000, cog: { x: cogX, y: 0, z: -0.2 } },
    liftPoints: [
      { id: "A", position: { x: -1, y: 0, z: 0 }, axis: up },
      { id: "B", position: { x: 1, y: 0, z: 0 }, axis: up },
    ],
    hanging: { kind: "beam", hookZM: 3, beam: { massKg: 150, wllKg: 5000, lengthM: 2.5, dropLengthM: 1 } },
    ruleSet: "uk-eu",
    todayIso: "2026-01-05",
  });

  it("vertical drops share the load by the lever rule: 1000/1000 kg centred, 1500/500 kg with the CoG 0.5 m off (statics of a simply supported beam, common practice)", () => {
    for (const [cogX, a, b] of [
      [0, 1000, 1000],
      [0.5, 500, 1500],
    ] as const) {
      const r = solveArrangement(beamInput(cogX), REFERENCE_TABLES);
      expect(r.status).toBe(200);
      if (r.status !== 200) return;
      expect(r.body.legs.map((l) => l.tensionKg)).toEqual([expect.closeTo(a, 6), expect.closeTo(b, 6)]);
      expect(r.body.legs.every((l) => l.angleFromVerticalDeg === 0)).toBe(true);
      expect(r.body.beam?.hookMassKg).toBeCloseTo(2150, 6);
      expect(r.body.checks?.find((c) => c.id === "beam")?.verdict).toBe("pass");
    }
  });

  it("a beam shorter than the lift points' spread cannot hang (422, changes nothing)", () => {
    const input = beamInput(0);
    const r = solveArrangement(
      {
        ...input,
        hanging: { kind: "beam", hookZM: 3, beam: { massKg: 150, wllKg: 5000, lengthM: 1.5, dropLengthM: 1 } },
      },
      REFERENCE_TABLES,
    );
    expect(r).toEqual({ status: 422, body: expect.objectContaining({ code: "BEAM_TOO_SHORT" }) });
  });
});
