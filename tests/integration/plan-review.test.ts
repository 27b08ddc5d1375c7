// The review page is the whole revision as the appointed person signs for it: its results and gear are
// worked out again as the page opens (never the copy stored on the last save), and every reason the
// approval would be refused is in the page's data before any password is asked for. The server still
// refuses the approval itself.
import { describe, expect, it } from "vitest";
import * as review from "~/routes/plans.$planId.review";
import { changeGearStatus, reportGearDefect } from "~/gear/lifecycle.server";
import { PlanRevision } from "~/models/plan.server";
import type { ApprovalRefusal, ReviewGearRow } from "~/plans/approval-readiness";
import type { PlanResults } from "~/plans/document";
import { submitRevision } from "~/plans/workflow.server";
import { callRoute, getRequest, postForm, TEST_PASSWORD } from "../support/factories";
import { readyPlan } from "../support/workflow";

type ReviewData = {
  revision: { status: string; results: PlanResults; arrangement: { mode: string; hookHeightM: number } };
  gear: ReviewGearRow[];
  refusals: ApprovalRefusal[];
  permissions: { approve: { allowed: boolean } };
};

async function inReview() {
  const ready = await readyPlan();
  const org = ready.planner.organisationId;
  expect((await submitRevision(org, ready.plan.id, ready.planner, {})).ok).toBe(true);
  const open = async () => {
    const res = await callRoute(review.loader, await getRequest(`/plans/${ready.plan.id}/review`, ready.approver), {
      planId: String(ready.plan.id),
    });
    expect(res.status).toBe(200);
    return res.data as ReviewData;
  };
  const approve = async () =>
    callRoute(
      review.action,
      await postForm(
        `/plans/${ready.plan.id}/review`,
        { intent: "approve", password: TEST_PASSWORD, typedName: ready.approver.name, comment: "" },
        ready.approver,
      ),
      { planId: String(ready.plan.id) },
    );
  return { ...ready, org, open, approve };
}

describe("the review page works the plan out again as it opens", () => {
  it("shows the figures and every item in service, with nothing to refuse, for a fit plan", async () => {
    const { open, gear } = await inReview();
    const data = await open();
    expect(data.refusals).toEqual([]);
    expect(data.permissions.approve.allowed).toBe(true);
    expect(data.revision.results.status).toBe(200);
    // A symmetric two-leg bridle: each leg carries W / (2 cos θ), θ from vertical (statics of a two-leg
    // sling, common practice). Lift points at x = ±0.8 m, z = 0.9 m, hook over the CoG at x = 0.
    const { hookHeightM } = data.revision.arrangement;
    const theta = Math.atan2(0.8, hookHeightM - 0.9);
    const results = data.revision.results as Extract<PlanResults, { status: 200 }>;
    for (const leg of results.body.legs) expect(leg.tensionKg).toBeCloseTo(2000 / (2 * Math.cos(theta)), 1);
    expect(data.gear.map((g) => [g.position, g.itemCode, g.status, g.problems])).toEqual([
      ["Leg A eyebolt", gear.eyeboltA.itemCode, "in_service", []],
      ["Leg A sling", gear.slingA.itemCode, "in_service", []],
      ["Leg B eyebolt", gear.eyeboltB.itemCode, "in_service", []],
      ["Leg B sling", gear.slingB.itemCode, "in_service", []],
      ["Master link", gear.masterLink.itemCode, "in_service", []],
      ["Crane or hoist", gear.crane.itemCode, "in_service", []],
    ]);
  });

  it("after an allocated sling is withdrawn, gives fresh results and names it; the approval is refused before and at the password", async () => {
    const { open, approve, org, plan, planner, gear } = await inReview();
    const stored = (await PlanRevision.findOne({ where: { planId: plan.id } }))!.results;
    expect((JSON.parse(stored) as PlanResults).status).toBe(200);

    const withdrawn = await changeGearStatus(
      org,
      gear.slingB.id,
      { status: "withdrawn", reason: "Link stretched beyond the discard limit" },
      planner.id,
    );
    expect(withdrawn.ok).toBe(true);

    const data = await open();
    // Worked out now: the withdrawn sling cannot stand in the allocation, whatever was stored on submission.
    expect(data.revision.results.status).toBe(400);
    expect((data.revision.results.body as { error: string }).error).toContain(`${gear.slingB.itemCode} is withdrawn`);
    const row = data.gear.find((g) => g.position === "Leg B sling")!;
    expect(row).toMatchObject({ itemCode: gear.slingB.itemCode, status: "withdrawn" });
    expect(row.problems).toEqual([expect.stringMatching(/has been withdrawn from service since \d{4}-\d{2}-\d{2}/)]);
    expect(data.refusals.map((r) => r.kind)).toEqual(["results", "gear"]);
    expect(data.refusals[1]!.message).toContain(`Not fit to lift: ${gear.slingB.itemCode} (Leg B sling)`);
    // The stored copy is untouched: the page did not read it.
    expect((await PlanRevision.findOne({ where: { planId: plan.id } }))!.results).toBe(stored);

    // The approval is still refused on the server, with the right password and name.
    const refused = await approve();
    expect(refused.status).toBe(409);
    const row2 = (await PlanRevision.findOne({ where: { planId: plan.id } }))!;
    expect(row2.status).toBe("in_review");
    expect(row2.sealed).toBeNull();
  });

  it("a quarantined eyebolt is named once, as not fit to lift, not again as a failing examination check", async () => {
    const { open, approve, org, plan, rigger, gear } = await inReview();
    expect(await reportGearDefect(org, gear.eyeboltA.id, "Collar cracked", rigger)).not.toBeNull();
    const data = await open();
    expect(data.revision.results.status).toBe(200);
    const results = data.revision.results as Extract<PlanResults, { status: 200 }>;
    // The fresh checks fail the quarantined item...
    expect(results.body.checks!.some((c) => c.itemCode === gear.eyeboltA.itemCode && c.status === "fail")).toBe(true);
    // ...and the reasons say it once, from the register.
    const naming = data.refusals.filter((r) => r.message.includes(gear.eyeboltA.itemCode));
    expect(naming).toHaveLength(1);
    expect(naming[0]).toMatchObject({ kind: "gear" });
    expect(naming[0]!.message).toMatch(/has been quarantined since/);
    expect(data.gear.find((g) => g.position === "Leg A eyebolt")).toMatchObject({
      status: "quarantined",
      statusReason: expect.stringContaining("Collar cracked"),
    });
    expect((await approve()).status).toBe(409);
    expect((await PlanRevision.findOne({ where: { planId: plan.id } }))!.status).toBe("in_review");
  });
});
