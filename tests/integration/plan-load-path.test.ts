// Submission and approval are refused, naming the position, while the load path is not complete.
import { describe, expect, it } from "vitest";
import { getPlan, PlanRevision } from "~/models/plan.server";
import type { RiggingAllocation } from "~/plans/document";
import { savePlanRevision } from "~/plans/revisions.server";
import { approveRevision, submitRevision } from "~/plans/workflow.server";
import { TEST_PASSWORD } from "../support/factories";
import { readyPlan } from "../support/workflow";

async function saveRigging(
  ready: Awaited<ReturnType<typeof readyPlan>>,
  edit: (r: RiggingAllocation) => RiggingAllocation,
) {
  const org = ready.planner.organisationId;
  const found = (await getPlan(org, ready.plan.id))!;
  const saved = await savePlanRevision(
    org,
    ready.plan.id,
    found.revision.version,
    {
      title: ready.plan.title,
      arrangement: found.revision.arrangement,
      rigging: edit(structuredClone(found.revision.rigging)),
      details: found.revision.details,
    },
    ready.planner.id,
  );
  expect(saved.status).toBe("saved");
}

describe("a complete load path before review", () => {
  it("submission is refused naming each leg without its sling, and nothing changes", async () => {
    const ready = await readyPlan();
    await saveRigging(ready, (r) => ({ ...r, legs: { ...r.legs, B: { ...r.legs.B!, slingItemId: undefined } } }));
    const refused = await submitRevision(ready.planner.organisationId, ready.plan.id, ready.planner, {});
    expect(refused).toMatchObject({
      ok: false,
      status: 409,
      message: "Submission is refused: the load path is not complete. Leg B has no sling.",
    });
    expect((await getPlan(ready.planner.organisationId, ready.plan.id))!.revision.status).toBe("draft");
  });

  it("a plan without a master link needs the crane hook stated as taking the legs directly; one without a crane is refused", async () => {
    const ready = await readyPlan();
    const org = ready.planner.organisationId;
    await saveRigging(ready, (r) => ({ ...r, masterLinkItemId: undefined, craneItemId: undefined }));
    const refused = await submitRevision(org, ready.plan.id, ready.planner, {});
    expect(refused).toMatchObject({
      ok: false,
      message:
        "Submission is refused: the load path is not complete. The legs have no top fitting: allocate a master link, or state that the crane hook takes the legs directly. No crane or hoist is allocated.",
    });
    await saveRigging(ready, (r) => ({ ...r, hookTakesLegs: true, craneItemId: ready.gear.crane.id }));
    expect((await submitRevision(org, ready.plan.id, ready.planner, {})).ok).toBe(true);
  });

  it("approval is refused too when a revision in review lacks part of its load path", async () => {
    const ready = await readyPlan();
    const org = ready.planner.organisationId;
    expect((await submitRevision(org, ready.plan.id, ready.planner, {})).ok).toBe(true);
    // A revision submitted before the rule held: its eyebolt at A is missing.
    const row = (await PlanRevision.findOne({ where: { planId: ready.plan.id } }))!;
    const rigging = JSON.parse(row.rigging) as RiggingAllocation;
    delete rigging.legs.A!.eyeboltItemId;
    await row.update({ rigging: JSON.stringify(rigging) });
    const refused = await approveRevision(org, ready.plan.id, ready.approver, {
      password: TEST_PASSWORD,
      typedName: ready.approver.name,
      comment: "",
    });
    expect(refused).toMatchObject({
      ok: false,
      status: 409,
      message:
        "Approval is refused: the load path is not complete. Leg A has no eyebolt at the load (lift point A is a tapped M30 hole).",
    });
    expect((await row.reload()).status).toBe("in_review");
    expect(row.sealed).toBeNull();
  });
});
