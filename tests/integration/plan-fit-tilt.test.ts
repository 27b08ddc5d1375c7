// A plan on slings of given lengths holds the load's tilt against the component's fit tolerance, in the
// results the server stores (and so on the plan page, review and printed plan).
import { describe, expect, it } from "vitest";
import * as planApi from "~/routes/api.plans.$planId";
import { callRoute, getRequest, makeUser } from "../support/factories";
import { jsonRequest, makePlan, twoPointElement } from "../support/plans";

type Check = { id: string; verdict: string; utilisation: number; source: string; message: string; fix: unknown };

async function planBody(planId: number, user: { id: number }) {
  const res = await callRoute(planApi.loader, await getRequest(`/api/plans/${planId}`, user), {
    planId: String(planId),
  });
  return res.data as {
    version: number;
    title: string;
    arrangement: Record<string, unknown>;
    rigging: Record<string, unknown>;
    details: Record<string, unknown>;
    results: { status: number; body: { checks: Check[]; levelling?: { legs: Array<{ changeM: number }> } } };
  };
}

describe("the load's tilt in a plan", () => {
  it("slings 1,300 and 1,250 mm tilt the element past its 0.5 deg fit tolerance: the stored check fails with shorten leg A by 50 mm", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(
      planner,
      twoPointElement({ fitToleranceDeg: 0.5, fitToleranceSource: "Element drawing EL-4, note 2" }),
    );
    const before = await planBody(plan.id, planner);
    // Level by design: the check is there and passes.
    const level = before.results.body.checks.find((c) => c.id === "fit-tilt");
    expect(level?.verdict).toBe("pass");
    const res = await callRoute(
      planApi.action,
      await jsonRequest(
        `/api/plans/${plan.id}`,
        {
          version: before.version,
          title: before.title,
          arrangement: { ...before.arrangement, mode: "lengths", legLengthsM: { A: 1.3, B: 1.25 } },
          rigging: before.rigging,
          details: before.details,
        },
        planner,
      ),
      { planId: String(plan.id) },
    );
    expect(res.status).toBe(200);
    const after = await planBody(plan.id, planner);
    expect(after.results.status).toBe(200);
    const fit = after.results.body.checks.find((c) => c.id === "fit-tilt")!;
    expect(fit.verdict).toBe("fail");
    expect(fit.utilisation).toBeGreaterThan(1);
    expect(fit.source).toContain("Element drawing EL-4, note 2");
    // Lift points 1.6 m apart at one height: B binds and A is 50 mm longer than it needs to be.
    expect(fit.message).toMatch(/shorten leg A by 50 mm/);
  });
  it("a component with no fit tolerance is held to the common-practice 1 deg and the check says so", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    const body = await planBody(plan.id, planner);
    const fit = body.results.body.checks.find((c) => c.id === "fit-tilt")!;
    expect(fit.source).toMatch(/common practice/);
    expect(fit.message).toMatch(/common practice/);
  });
});
