import fc from "fast-check";
import { describe, expect, it } from "vitest";
import * as solve from "~/routes/api.solve";
import { getReferenceTables, ReferenceRow } from "~/models/reference-row.server";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { callRoute, makeUser, sessionCookie } from "../support/factories";

async function post(body: string, user?: { id: number }) {
  return new Request("http://localhost:3000/api/solve", {
    method: "POST",
    body,
    headers: { "Content-Type": "application/json", ...(user ? { Cookie: await sessionCookie(user) } : {}) },
  });
}

// Engineering note "Sling Load" (Furley Engineering): 2000 kg, lift points 800 mm and 200 mm either
// side of the CoG, hook 800 mm above them; near leg 1649.2 kg (published 1650 kg), far leg 565.7 kg.
const furley = {
  load: { massKg: 2000, cog: { x: 0, y: 0, z: 0 } },
  liftPoints: [
    { id: "A", x: -0.8, y: 0, z: 0 },
    { id: "B", x: 0.2, y: 0, z: 0 },
  ],
  hook: { z: 0.8 },
};

describe("POST /api/solve", () => {
  it("answers the two-leg worked example in level mode (Furley Engineering, 'Sling Load')", async () => {
    const user = await makeUser(["planner"]);
    const res = await callRoute(solve.action, await post(JSON.stringify(furley), user));
    expect(res.status).toBe(200);
    const body = res.data as {
      mode: string;
      method: string;
      tiltDeg: number;
      weightKn: number;
      legs: Array<{ liftPointId: string; tensionKg: number; lengthM: number }>;
    };
    expect(body.mode).toBe("level");
    expect(body.method).toBe("determinate");
    expect(body.weightKn).toBeCloseTo(19.6133, 4);
    const byId = Object.fromEntries(body.legs.map((l) => [l.liftPointId, l]));
    expect(byId.B!.tensionKg).toBeCloseTo(1649.2, 1);
    expect(byId.A!.tensionKg).toBeCloseTo(565.7, 1);
    expect(byId.B!.lengthM).toBeCloseTo(0.8246, 4);
  });

  it("feeds the level-mode lengths back and settles level (round trip)", async () => {
    const user = await makeUser(["planner"]);
    const { hook: _hook, ...rest } = furley;
    const res = await callRoute(
      solve.action,
      await post(JSON.stringify({ ...rest, legLengths: { A: Math.hypot(0.8, 0.8), B: Math.hypot(0.2, 0.8) } }), user),
    );
    expect(res.status).toBe(200);
    expect((res.data as { mode: string; tiltDeg: number }).tiltDeg).toBeLessThan(1e-6);
  });

  it("refuses geometry that cannot hang level with 422 and a sentence", async () => {
    const user = await makeUser(["planner"]);
    const offPlane = { ...furley, load: { massKg: 2000, cog: { x: 0, y: 0.3, z: -0.2 } } };
    const res = await callRoute(solve.action, await post(JSON.stringify(offPlane), user));
    expect(res.status).toBe(422);
    expect(res.data).toMatchObject({ error: expect.any(String), code: expect.any(String) });
  });

  it("refuses non-JSON and invalid bodies with 400, and an anonymous caller with 401", async () => {
    const user = await makeUser(["planner"]);
    const notJson = await callRoute(solve.action, await post("{ nope", user));
    expect(notJson.status).toBe(400);
    expect(notJson.data).toMatchObject({ error: expect.stringMatching(/not valid JSON/) });
    const invalid = await callRoute(solve.action, await post(JSON.stringify({ load: { massKg: -1 } }), user));
    expect(invalid.status).toBe(400);
    expect((invalid.data as { issues: unknown[] }).issues.length).toBeGreaterThan(0);
    const huge = await callRoute(solve.action, await post(JSON.stringify({ pad: "x".repeat(70_000) }), user));
    expect(huge.status).toBe(400);
    const anonymous = await callRoute(solve.action, await post(JSON.stringify(furley)));
    expect(anonymous.status).toBe(401);
  });

  it("never answers outside 200, 400 and 422 for any JSON body", async () => {
    const user = await makeUser(["planner"]);
    const cookie = await sessionCookie(user);
    await fc.assert(
      fc.asyncProperty(fc.jsonValue(), async (value) => {
        const req = new Request("http://localhost:3000/api/solve", {
          method: "POST",
          body: JSON.stringify(value),
          headers: { Cookie: cookie },
        });
        const res = await callRoute(solve.action, req);
        expect([200, 400, 422]).toContain(res.status);
        if (res.status !== 200) expect(typeof (res.data as { error: unknown }).error).toBe("string");
      }),
      { numRuns: 300 },
    );
  });
});

describe("reference tables in the database", () => {
  it("hold every published row with its source, as the checks read them", async () => {
    const tables = await getReferenceTables();
    expect(tables).toEqual(JSON.parse(JSON.stringify(REFERENCE_TABLES)));
    const sources = await ReferenceRow.findAll();
    expect(sources.length).toBeGreaterThan(50);
    for (const row of sources) expect(row.source.length, row.tableName).toBeGreaterThan(5);
  });
});
