import { describe, expect, it } from "vitest";
import * as newPlan from "~/routes/plans.new";
import * as planPage from "~/routes/plans.$planId";
import * as planDetails from "~/routes/plans.$planId.details";
import * as jobPage from "~/routes/jobs.$jobId";
import { AuditEvent } from "~/models/audit-event.server";
import { createComponent, updateComponent } from "~/models/component.server";
import { getPlan, Plan } from "~/models/plan.server";
import { callRoute, getRequest, makeUser, postForm } from "../support/factories";
import { makeJob, makePlan, twoPointElement } from "../support/plans";

function detailsFields(overrides: Record<string, string> = {}): Record<string, string> {
  return {
    version: "1",
    "step-0-title": "Rig",
    "step-0-notes": "",
    "step-1-title": "Trial lift 100 mm and hold",
    "step-1-hold": "on",
    "step-1-notes": "Check the legs share as planned.",
    "hazard-0-hazard": "Crush between the element and the housing",
    "hazard-0-control": "Hands off; tag lines only",
    "person-0-name": "Dale Hutton",
    "person-0-role": "slinger_signaller",
    exclusionZone: "Barrier 2 m around the package",
    communication: "Radio on channel 3",
    floorClearance: "150",
    ...overrides,
  };
}

describe("plan pages", () => {
  it("a planner starts a plan from a job and a component, and the job lists it", async () => {
    const planner = await makeUser(["planner"]);
    const job = await makeJob(planner);
    const component = await createComponent(planner.organisationId, twoPointElement(), planner.id);
    const form = await callRoute(newPlan.loader, await getRequest(`/plans/new?jobId=${job.id}`, planner));
    expect(form.data).toMatchObject({ jobId: job.id, components: [{ id: component.id, liftPoints: 2 }] });
    const res = await callRoute(
      newPlan.action,
      await postForm(
        "/plans/new",
        { jobId: String(job.id), componentId: String(component.id), title: "Lift out" },
        planner,
      ),
    );
    expect(res.status).toBe(302);
    const planId = Number(res.headers.get("Location")!.split("/").pop());
    const found = await getPlan(planner.organisationId, planId);
    expect(found?.revision).toMatchObject({
      revision: 1,
      status: "draft",
      version: 1,
      componentId: component.id,
      componentVersion: 1,
    });
    const jobView = await callRoute(jobPage.loader, await getRequest(`/jobs/${job.id}`, planner), {
      jobId: String(job.id),
    });
    expect((jobView.data as { plans: unknown[] }).plans).toEqual([
      { id: planId, title: "Lift out", status: "draft", revision: 1 },
    ]);
  });

  it("starting a plan refuses another organisation's component or job, and a missing title, writing nothing", async () => {
    const planner = await makeUser(["planner"]);
    const job = await makeJob(planner);
    const stranger = await makeUser(["planner"]);
    const theirs = await createComponent(stranger.organisationId, twoPointElement(), stranger.id);
    const before = await Plan.count();
    const foreign = await callRoute(
      newPlan.action,
      await postForm(
        "/plans/new",
        { jobId: String(job.id), componentId: String(theirs.id), title: "Lift out" },
        planner,
      ),
    );
    expect(foreign.status).toBe(400);
    expect(foreign.data).toMatchObject({
      errors: { componentId: ["There is no such component in your organisation."] },
    });
    const untitled = await callRoute(
      newPlan.action,
      await postForm("/plans/new", { jobId: String(job.id), componentId: String(theirs.id), title: " " }, planner),
    );
    expect(untitled.status).toBe(400);
    const theirJob = await makeJob(stranger);
    const mine = await createComponent(planner.organisationId, twoPointElement(), planner.id);
    expect(
      (
        await callRoute(
          newPlan.action,
          await postForm(
            "/plans/new",
            { jobId: String(theirJob.id), componentId: String(mine.id), title: "x" },
            planner,
          ),
        )
      ).status,
    ).toBe(400);
    expect(await Plan.count()).toBe(before);
    const rigger = await makeUser(["rigger"], { organisationId: planner.organisationId });
    expect(
      (
        await callRoute(
          newPlan.action,
          await postForm("/plans/new", { jobId: String(job.id), componentId: String(mine.id), title: "x" }, rigger),
        )
      ).status,
    ).toBe(403);
  });

  it("the plan page shows the newer component version with what changed, and the planner pulls it in", async () => {
    const planner = await makeUser(["planner"]);
    const { plan, component } = await makePlan(planner);
    const moved = twoPointElement({ massKg: 2200, cog: { x: 0.05, y: 0, z: 0.5 } });
    moved.liftPoints = [moved.liftPoints[0]!, { ...moved.liftPoints[1]!, label: "C" }];
    await updateComponent(planner.organisationId, component.id, moved, 1, planner.id);
    const page = await callRoute(planPage.loader, await getRequest(`/plans/${plan.id}`, planner), {
      planId: String(plan.id),
    });
    const comparison = (page.data as { comparison: { newer: boolean; changes: Array<{ kind: string }> } }).comparison;
    expect(comparison.newer).toBe(true);
    expect(comparison.changes.map((c) => c.kind)).toEqual(
      expect.arrayContaining(["mass", "cog", "lift-point-added", "lift-point-removed"]),
    );
    const rigger = await makeUser(["rigger"], { organisationId: planner.organisationId });
    expect(
      (
        await callRoute(
          planPage.action,
          await postForm(`/plans/${plan.id}`, { intent: "pull-component", version: "1" }, rigger),
          { planId: String(plan.id) },
        )
      ).status,
    ).toBe(403);
    const pulled = await callRoute(
      planPage.action,
      await postForm(`/plans/${plan.id}`, { intent: "pull-component", version: "1" }, planner),
      { planId: String(plan.id) },
    );
    expect(pulled.status).toBe(302);
    const found = await getPlan(planner.organisationId, plan.id);
    expect(found?.revision).toMatchObject({ version: 2, componentVersion: 2, snapshot: { massKg: 2200 } });
    // Lift point B went away: the arrangement keeps only A.
    expect(found?.revision.arrangement.liftPointLabels).toEqual(["A"]);
    const audit = await AuditEvent.findOne({
      where: { entity: "plan", entityId: plan.id, action: "component version pulled" },
    });
    expect(audit).not.toBeNull();
    const again = await callRoute(
      planPage.action,
      await postForm(`/plans/${plan.id}`, { intent: "pull-component", version: "1" }, planner),
      { planId: String(plan.id) },
    );
    expect(again.status).toBe(409);
  });

  it("a planner saves the sequence, hazards and people; a stale form gets 409 and bad input 400", async () => {
    const planner = await makeUser(["planner", "admin"]);
    const { plan } = await makePlan(planner);
    const params = { planId: String(plan.id) };
    const bad = await callRoute(
      planDetails.action,
      await postForm(
        `/plans/${plan.id}/details`,
        detailsFields({ floorClearance: "lots", "hazard-0-control": "" }),
        planner,
      ),
      params,
    );
    expect(bad.status).toBe(400);
    expect(Object.keys((bad.data as { errors: Record<string, string[]> }).errors)).toEqual(
      expect.arrayContaining(["floorClearanceM", "hazards.0.control"]),
    );
    expect((await getPlan(planner.organisationId, plan.id))?.revision.version).toBe(1);
    const ok = await callRoute(
      planDetails.action,
      await postForm(`/plans/${plan.id}/details`, detailsFields(), planner),
      params,
    );
    expect(ok.status).toBe(302);
    const found = await getPlan(planner.organisationId, plan.id);
    expect(found?.revision.version).toBe(2);
    expect(found?.revision.details).toMatchObject({
      sequence: [
        { title: "Rig", holdPoint: false },
        { title: "Trial lift 100 mm and hold", holdPoint: true },
      ],
      hazards: [{ hazard: "Crush between the element and the housing" }],
      people: [{ name: "Dale Hutton", role: "slinger_signaller" }],
      communication: "Radio on channel 3",
    });
    expect(found?.revision.details.floorClearanceM).toBeCloseTo(0.15, 9);
    const stale = await callRoute(
      planDetails.action,
      await postForm(`/plans/${plan.id}/details`, detailsFields({ communication: "Hand signals" }), planner),
      params,
    );
    expect(stale.status).toBe(409);
    expect((await getPlan(planner.organisationId, plan.id))?.revision.details.communication).toBe("Radio on channel 3");
  });

  it("everyone in the organisation reads the plan page; other organisations get 404", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    const rigger = await makeUser(["rigger"], { organisationId: planner.organisationId });
    const page = await callRoute(planPage.loader, await getRequest(`/plans/${plan.id}`, rigger), {
      planId: String(plan.id),
    });
    expect(page.status).toBe(200);
    expect(page.data).toMatchObject({ canEdit: false, revision: { status: "draft" } });
    expect(
      (
        await callRoute(planDetails.loader, await getRequest(`/plans/${plan.id}/details`, rigger), {
          planId: String(plan.id),
        })
      ).status,
    ).toBe(403);
    const stranger = await makeUser(["planner"]);
    expect(
      (await callRoute(planPage.loader, await getRequest(`/plans/${plan.id}`, stranger), { planId: String(plan.id) }))
        .status,
    ).toBe(404);
    expect(
      (
        await callRoute(planDetails.action, await postForm(`/plans/${plan.id}/details`, detailsFields(), stranger), {
          planId: String(plan.id),
        })
      ).status,
    ).toBe(404);
    expect((await callRoute(planPage.loader, await getRequest(`/plans/abc`, planner), { planId: "abc" })).status).toBe(
      404,
    );
  });
});
