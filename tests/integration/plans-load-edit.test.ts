import { describe, expect, it } from "vitest";
import * as planApi from "~/routes/api.plans.$planId";
import { getComponent } from "~/models/component.server";
import { callRoute, getRequest, makeUser } from "../support/factories";
import { jsonRequest, makePlan } from "../support/plans";

type Body = {
  version: number;
  title: string;
  arrangement: unknown;
  rigging: unknown;
  details: unknown;
  snapshot: { cog: { x: number }; liftPoints: Array<{ label: string; position: { x: number } }> };
  results: { status: number; body: { legs: Array<{ liftPointId: string; verticalShare: number }> } };
};

async function load(planId: number, user: { id: number }) {
  return (await callRoute(planApi.loader, await getRequest(`/api/plans/${planId}`, user), { planId: String(planId) }))
    .data as Body;
}

describe("moving the lift points and overriding the CoG in the editor", () => {
  it("changes the plan's own copy of the load and the results, never the component", async () => {
    const planner = await makeUser(["planner"]);
    const { plan, component } = await makePlan(planner);
    const before = await load(plan.id, planner);
    const payload = {
      version: before.version,
      title: before.title,
      arrangement: before.arrangement,
      rigging: before.rigging,
      details: before.details,
      load: {
        override: { cog: { x: 0.4, y: 0, z: 0.5 }, reason: "Weighed at the four corners on site" },
        liftPoints: [
          { label: "A", position: { x: -0.8, y: 0, z: 0.9 } },
          { label: "B", position: { x: 0.8, y: 0, z: 0.9 } },
        ],
      },
    };
    const res = await callRoute(planApi.action, await jsonRequest(`/api/plans/${plan.id}`, payload, planner, "PUT"), {
      planId: String(plan.id),
    });
    expect(res.status).toBe(200);
    const after = res.data as Body;
    expect(after.snapshot.cog.x).toBe(0.4);
    // Lever rule (common practice): G at 1.2 m from A and 0.4 m from B on a 1.6 m span puts 3/4 of the weight on B.
    const shareB = after.results.body.legs.find((l) => l.liftPointId === "B")!.verticalShare;
    expect(shareB).toBeCloseTo(0.75, 9);
    expect((await getComponent(planner.organisationId, component.id))!.cogXM).toBe(0);
  });

  it("refuses a lift point the load does not have, writing nothing", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    const before = await load(plan.id, planner);
    const payload = {
      version: before.version,
      title: before.title,
      arrangement: before.arrangement,
      rigging: before.rigging,
      details: before.details,
      load: { liftPoints: [{ label: "Z", position: { x: 0, y: 0, z: 1 } }] },
    };
    const res = await callRoute(planApi.action, await jsonRequest(`/api/plans/${plan.id}`, payload, planner, "PUT"), {
      planId: String(plan.id),
    });
    expect(res.status).toBe(400);
    expect((res.data as { error: string }).error).toMatch(/no lift point Z/);
    expect((await load(plan.id, planner)).version).toBe(before.version);
  });
});
