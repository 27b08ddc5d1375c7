// The /api/solve contract: 200 / 400 / 422 bodies, and no input ever makes it throw.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { handleSolve, solveBodySchema } from "./api";

const furley = {
  load: { massKg: 2000, cog: { x: 0, y: 0, z: -0.1 } },
  liftPoints: [
    { id: "A", x: -0.2, y: 0, z: 0, axis: { x: 0, y: 0, z: 2 } },
    { id: "B", x: 0.8, y: 0, z: 0 },
  ],
  hook: { z: 0.8 },
};

function solve(body: unknown, today?: string) {
  return handleSolve(body, REFERENCE_TABLES, today ? { todayIso: today } : {});
}

describe("200: level and given-lengths answers", () => {
  it("level mode returns the contract fields (Furley Engineering 'Sling Load': 1649.2 kg and 565.7 kg)", () => {
    const r = solve(furley);
    expect(r.status).toBe(200);
    if (r.status !== 200) return;
    const b = r.body;
    expect(Object.keys(b).sort()).toEqual([
      "checks",
      "hook",
      "legs",
      "method",
      "mode",
      "rating",
      "ruleSet",
      "tiltDeg",
      "tiltPlanes",
      "warnings",
      "weightKn",
    ]);
    expect(b.mode).toBe("level");
    expect(b.method).toBe("determinate");
    expect(b.weightKn).toBeCloseTo(19.6133, 12);
    expect(b.hook).toEqual({ x: 0, y: 0, z: 0.8 });
    expect(b.tiltDeg).toBe(0);
    expect(Object.keys(b.legs[0]!).sort()).toEqual([
      "angleFromVerticalDeg",
      "axisAngleDeg",
      "lengthM",
      "liftPointId",
      "slack",
      "tensionKg",
      "tensionKn",
      "verticalShare",
    ]);
    expect(b.legs[0]!.tensionKg).toBeCloseTo(1649.2, 1);
    expect(b.legs[1]!.tensionKg).toBeCloseTo(565.7, 1);
    // The axis (0,0,2) is normalised: the axis angle equals the angle from vertical.
    expect(b.legs[0]!.axisAngleDeg).toBeCloseTo(b.legs[0]!.angleFromVerticalDeg, 12);
  });
  it("given-lengths mode with the level lengths hangs level (round trip)", () => {
    const level = solve(furley);
    if (level.status !== 200) throw new Error("level failed");
    const lengths = Object.fromEntries(level.body.legs.map((l) => [l.liftPointId, l.lengthM]));
    const r = solve({ ...furley, hook: undefined, legLengths: lengths });
    expect(r.status).toBe(200);
    if (r.status !== 200) return;
    expect(r.body.mode).toBe("lengths");
    expect(r.body.tiltDeg).toBeLessThan(1e-6);
    expect(r.body.legs[0]!.tensionKg).toBeCloseTo(1649.2, 1);
  });
  it("rigging adds checks, with inspection status when the server gives today's date", () => {
    const body = {
      ...furley,
      rigging: {
        legs: {
          A: {
            sling: {
              kind: "chain",
              diameterMm: 8,
              inspection: { itemId: "CH-7", status: "in_service", examinationDue: "2025-01-01" },
            },
          },
          B: { sling: { kind: "chain", diameterMm: 8 }, shackle: { type: "bow", wll: { value: 1, unit: "t" } } },
        },
        crane: { swlKg: 5000 },
        contingencyPct: 5,
      },
    };
    const r = solve(body, "2025-06-01");
    expect(r.status).toBe(200);
    if (r.status !== 200) return;
    const ids = (r.body.checks ?? []).map((c) => c.id);
    expect(ids).toEqual(
      expect.arrayContaining([
        "angle-A",
        "sling-leg-A",
        "sling-leg-B",
        "shackle-B",
        "sling-assembly",
        "crane-load",
        "inspection-CH-7",
      ]),
    );
    expect(r.body.checks!.find((c) => c.id === "inspection-CH-7")!.status).toBe("fail");
    expect(r.body.checks!.find((c) => c.id === "crane-load")!.loadKg).toBeCloseTo(2100, 9);
  });
});

describe("400: bad input, with zod issues", () => {
  const bad: Array<[string, unknown]> = [
    ["null body", null],
    ["no mode", { ...furley, hook: undefined }],
    ["both modes", { ...furley, legLengths: { A: 1, B: 1 } }],
    ["duplicate ids", { ...furley, liftPoints: [furley.liftPoints[0], furley.liftPoints[0]] }],
    ["legLengths names an unknown id", { ...furley, hook: undefined, legLengths: { A: 1, B: 1, C: 1 } }],
    ["legLengths misses an id", { ...furley, hook: undefined, legLengths: { A: 1 } }],
    [
      "legLengths with __proto__ key",
      { ...furley, hook: undefined, legLengths: JSON.parse('{"A":1,"B":1,"__proto__":1}') },
    ],
    ["zero axis", { ...furley, liftPoints: [{ id: "A", x: 0, y: 0, z: 0, axis: { x: 0, y: 0, z: 0 } }] }],
    [
      "five lift points",
      { ...furley, liftPoints: ["A", "B", "C", "D", "E"].map((id, i) => ({ id, x: i, y: 0, z: 0 })) },
    ],
    ["no lift points", { ...furley, liftPoints: [] }],
    ["negative mass", { ...furley, load: { ...furley.load, massKg: -1 } }],
    ["zero mass", { ...furley, load: { ...furley.load, massKg: 0 } }],
    ["mass beyond 1e8 kg", { ...furley, load: { ...furley.load, massKg: 2e8 } }],
    ["coordinate beyond 1000 m", { ...furley, hook: { z: 1001 } }],
    ["NaN", { ...furley, hook: { z: Number.NaN } }],
    ["Infinity", { ...furley, hook: { z: Number.POSITIVE_INFINITY } }],
    ["string number", { ...furley, hook: { z: "0.8" } }],
    ["rigging for an unknown leg", { ...furley, rigging: { legs: { Z: {} } } }],
    ["both wllKg and wll", { ...furley, rigging: { masterLink: { wllKg: 1, wll: { value: 1, unit: "t" } } } }],
  ];
  it.each(bad)("%s -> 400 with a sentence and issues", (_name, body) => {
    const r = solve(body);
    expect(r.status).toBe(400);
    if (r.status !== 400) return;
    expect(r.body.error).toMatch(/^The solve request is not valid/);
    expect(r.body.issues.length).toBeGreaterThan(0);
  });
});

describe("400: an examination due date that is not on the calendar", () => {
  it("30 February is refused with the field named, not judged as a string", () => {
    const body = {
      ...furley,
      rigging: {
        legs: {
          A: {
            sling: {
              kind: "chain",
              diameterMm: 8,
              inspection: { itemId: "CH-7", status: "in_service", examinationDue: "2025-02-30" },
            },
          },
        },
      },
    };
    const r = solve(body, "2025-02-01");
    expect(r.status).toBe(400);
    if (r.status !== 400) return;
    expect(JSON.stringify(r.body.issues)).toMatch(/examinationDue/);
  });
});

describe("422: geometry that cannot hang as asked", () => {
  it("2 legs with the CoG off their plane: code and a sentence with the roll", () => {
    const r = solve({ ...furley, load: { massKg: 2000, cog: { x: 0, y: 0.1, z: -0.1 } } });
    expect(r.status).toBe(422);
    if (r.status !== 422) return;
    expect(r.body.code).toBe("COG_OFF_LEG_PLANE");
    expect(r.body.error).toMatch(/roll .* deg/);
  });
  it("zero-length leg in given-lengths mode", () => {
    const r = solve({ ...furley, hook: undefined, legLengths: { A: 0, B: 1 } });
    expect(r.status).toBe(422);
    if (r.status === 422) expect(r.body.code).toBe("ZERO_LENGTH_LEG");
  });
});

describe("never throws: any JSON value gets 200, 400 or 422, and an error sentence when not 200", () => {
  const num = fc.oneof(
    fc.double(),
    fc.integer(),
    fc.constantFrom(
      0,
      -0,
      1e308,
      -1e308,
      1e-308,
      Number.NaN,
      Number.POSITIVE_INFINITY,
      Number.NEGATIVE_INFINITY,
      1e7,
      1e8,
      1000,
      -1000,
    ),
  );
  const vec = fc.record({ x: num, y: num, z: num });
  const smallNum = fc.double({ min: -3, max: 3, noNaN: true, noDefaultInfinity: true });
  const id = fc.constantFrom("A", "B", "C", "D", "__proto__", "constructor", "");
  const nearValid = fc.record(
    {
      load: fc.record({
        massKg: fc.oneof(num, fc.double({ min: 0.001, max: 1e5, noNaN: true })),
        cog: fc.oneof(vec, fc.record({ x: smallNum, y: smallNum, z: smallNum })),
      }),
      liftPoints: fc.array(
        fc.record(
          {
            id,
            x: fc.oneof(smallNum, num),
            y: fc.oneof(smallNum, num),
            z: fc.oneof(smallNum, num),
            axis: fc.oneof(vec, fc.record({ x: smallNum, y: smallNum, z: smallNum })),
            thread: fc.constantFrom("M16", "M20", ""),
          },
          { requiredKeys: ["id", "x", "y", "z"] },
        ),
        { minLength: 0, maxLength: 5 },
      ),
      hook: fc.record({ z: fc.oneof(smallNum, num) }),
      legLengths: fc.dictionary(id, fc.oneof(fc.double({ min: 0, max: 5, noNaN: true }), num)),
      rigging: fc.record(
        {
          legs: fc.dictionary(
            id,
            fc.record(
              {
                sling: fc.record(
                  {
                    kind: fc.constantFrom("chain", "wire", "web", "round", "rope"),
                    diameterMm: fc.oneof(num, fc.constantFrom(8, 10, 16)),
                    colour: fc.constantFrom("green", "pink"),
                    wllKg: num,
                  },
                  { requiredKeys: ["kind"] },
                ),
                eyebolt: fc.record({
                  family: fc.constantFrom("collar", "shoulder", "plain"),
                  thread: fc.constantFrom("M16", "M20"),
                }),
                shackle: fc.record({ type: fc.constantFrom("bow", "dee"), wllKg: num, sideLoadAngleDeg: num }),
              },
              { requiredKeys: [] },
            ),
          ),
          sharedShackles: fc.array(fc.record({ legIds: fc.tuple(id, id), wllKg: num }), { maxLength: 2 }),
          masterLink: fc.record({ wllKg: num }),
          crane: fc.record({ swlKg: num, maxHookHeightM: num }),
          headroom: fc.record({ clearanceAboveFloorM: num, loadUndersideZM: num }),
          contingencyPct: num,
          riggingMassKg: num,
        },
        { requiredKeys: [] },
      ),
    },
    { requiredKeys: [] },
  );
  const anything = fc.oneof(fc.jsonValue({ maxDepth: 8 }), nearValid, fc.anything({ maxDepth: 4 }));
  it("1000 random bodies", () => {
    fc.assert(
      fc.property(anything, (body) => {
        const r = solve(body, "2025-06-01");
        expect([200, 400, 422]).toContain(r.status);
        if (r.status !== 200) expect(typeof r.body.error).toBe("string");
        // The defensive catch-all is never what answers.
        if (r.status === 422) expect(r.body.code).not.toBe("UNSOLVABLE");
        if (r.status === 200) {
          expect(Number.isFinite(r.body.weightKn)).toBe(true);
          for (const leg of r.body.legs) expect(Number.isFinite(leg.tensionKn)).toBe(true);
          expect(JSON.parse(JSON.stringify(r.body))).toBeTruthy();
        }
      }),
      { numRuns: 1000 },
    );
  });
  it("deeply nested input is a 400, not a stack overflow", () => {
    let deep: unknown = 1;
    for (let i = 0; i < 10000; i++) deep = { load: deep };
    expect(solve(deep).status).toBe(400);
  });
  it("the schema is exported for the route to reuse", () => {
    expect(solveBodySchema.safeParse(furley).success).toBe(true);
  });
});
