// Self-approval by authorship: whoever created, started, saved (through the editor's API or the details
// form), pulled a component version into, or submitted a revision is its author, and with self-approval
// off cannot approve it; the refusal says which of their actions made them one. Each path that writes a
// revision is taken through its own route.
import { describe, expect, it } from "vitest";
import * as planApi from "~/routes/api.plans.$planId";
import * as planDetails from "~/routes/plans.$planId.details";
import * as newPlan from "~/routes/plans.new";
import * as planPage from "~/routes/plans.$planId";
import * as review from "~/routes/plans.$planId.review";
import * as submit from "~/routes/plans.$planId.submit";
import { getComponent, toDefinition, updateComponent } from "~/models/component.server";
import { getPlan, Plan, PlanRevision } from "~/models/plan.server";
import type { SessionUser } from "~/models/user.server";
import { savePlanRevision } from "~/plans/revisions.server";
import { approveRevision, submitRevision } from "~/plans/workflow.server";
import { callRoute, getRequest, makeUser, postForm, TEST_PASSWORD } from "../support/factories";
import { jsonRequest } from "../support/plans";
import { readyPlan } from "../support/workflow";

const today = () =>
  new Date().toLocaleDateString("en-GB", { day: "numeric", month: "long", year: "numeric", timeZone: "UTC" });
const AUTHOR = ", so you are an author of this revision: another appointed person must approve it.";

async function setUp() {
  const ready = await readyPlan();
  const org = ready.planner.organisationId;
  const sam = await makeUser(["planner", "approver"], { organisationId: org, name: "Sam Both" });
  return { ...ready, org, sam };
}

/** The plan's working revision saved again by `user` with the rigging it already has (a save of the draft). */
async function resave(org: number, planId: number, user: SessionUser, from?: { rigging: unknown }) {
  const found = (await getPlan(org, planId))!;
  const saved = await savePlanRevision(
    org,
    planId,
    found.revision.version,
    {
      title: found.plan.title,
      arrangement: found.revision.arrangement,
      rigging: (from?.rigging ?? found.revision.rigging) as typeof found.revision.rigging,
      details: found.revision.details,
    },
    user.id,
  );
  expect(saved.status).toBe("saved");
}

/** Sam's approval through the review page's action: refused with 409 and the sentence naming the act. */
async function expectRefused(planId: number, sam: SessionUser, sentence: string) {
  const res = await callRoute(
    review.action,
    await postForm(
      `/plans/${planId}/review`,
      { intent: "approve", password: TEST_PASSWORD, typedName: sam.name, comment: "" },
      sam,
    ),
    { planId: String(planId) },
  );
  expect(res.status).toBe(409);
  expect((res.data as { error: string }).error).toBe(sentence);
  // The review page says the same before Sam even tries.
  const page = await callRoute(review.loader, await getRequest(`/plans/${planId}/review`, sam), {
    planId: String(planId),
  });
  expect(page.data).toMatchObject({ permissions: { approve: { allowed: false, reason: sentence } } });
}

describe("anyone who wrote a revision is its author", () => {
  it("creating the plan (the new plan form)", async () => {
    const { org, sam, planner, approver, plan } = await setUp();
    const original = (await getPlan(org, plan.id))!;
    const created = await callRoute(
      newPlan.action,
      await postForm(
        "/plans/new",
        { jobId: String(plan.jobId), componentId: String(original.revision.componentId), title: "Sam's plan" },
        sam,
      ),
    );
    expect(created.status).toBe(302);
    const samsPlan = (await Plan.findOne({ where: { title: "Sam's plan" } }))!;
    await resave(org, samsPlan.id, planner, original.revision);
    expect((await submitRevision(org, samsPlan.id, planner, {})).ok).toBe(true);
    await expectRefused(samsPlan.id, sam, `You created this plan on ${today()}${AUTHOR}`);
    // Another appointed person, who wrote nothing of it, approves it.
    const approved = await approveRevision(org, samsPlan.id, approver, {
      password: TEST_PASSWORD,
      typedName: approver.name,
      comment: "",
    });
    expect(approved).toMatchObject({ ok: true, selfApproved: false });
  });

  it("saving the draft through the editor's JSON API", async () => {
    const { org, sam, planner, plan } = await setUp();
    const found = (await getPlan(org, plan.id))!;
    const put = await callRoute(
      planApi.action,
      await jsonRequest(
        `/api/plans/${plan.id}`,
        {
          version: found.revision.version,
          title: plan.title,
          arrangement: found.revision.arrangement,
          rigging: found.revision.rigging,
          details: found.revision.details,
        },
        sam,
      ),
      { planId: String(plan.id) },
    );
    expect(put.status).toBe(200);
    expect((await submitRevision(org, plan.id, planner, {})).ok).toBe(true);
    await expectRefused(plan.id, sam, `You saved this revision on ${today()}${AUTHOR}`);
  });

  it("saving the sequence, hazards and people form", async () => {
    const { org, sam, planner, plan } = await setUp();
    const found = (await getPlan(org, plan.id))!;
    const res = await callRoute(
      planDetails.action,
      await postForm(
        `/plans/${plan.id}/details`,
        {
          version: String(found.revision.version),
          "step-0-title": "Rig",
          "step-0-notes": "",
          exclusionZone: "Barrier 2 m",
          communication: "Radio",
          floorClearance: "150",
        },
        sam,
      ),
      { planId: String(plan.id) },
    );
    expect(res.status).toBe(302);
    expect((await submitRevision(org, plan.id, planner, {})).ok).toBe(true);
    await expectRefused(plan.id, sam, `You saved this revision on ${today()}${AUTHOR}`);
  });

  it("pulling a newer component version into the draft", async () => {
    const { org, sam, planner, plan } = await setUp();
    const found = (await getPlan(org, plan.id))!;
    const component = (await getComponent(org, found.revision.componentId!))!;
    await updateComponent(
      org,
      component.id,
      { ...toDefinition(component), name: "Element, renamed" },
      component.version,
      planner.id,
    );
    const pulled = await callRoute(
      planPage.action,
      await postForm(`/plans/${plan.id}`, { intent: "pull-component", version: String(found.revision.version) }, sam),
      { planId: String(plan.id) },
    );
    expect(pulled.status).toBe(302);
    expect((await submitRevision(org, plan.id, planner, {})).ok).toBe(true);
    await expectRefused(plan.id, sam, `You pulled a new component version into it on ${today()}${AUTHOR}`);
  });

  it("starting a new revision from the approved one", async () => {
    const { org, sam, planner, approver, plan } = await setUp();
    expect((await submitRevision(org, plan.id, planner, {})).ok).toBe(true);
    expect(
      (
        await approveRevision(org, plan.id, approver, {
          password: TEST_PASSWORD,
          typedName: approver.name,
          comment: "",
        })
      ).ok,
    ).toBe(true);
    const started = await callRoute(
      planPage.action,
      await postForm(`/plans/${plan.id}`, { intent: "new-revision" }, sam),
      { planId: String(plan.id) },
    );
    expect(started.status).toBe(302);
    await resave(org, plan.id, planner);
    expect((await submitRevision(org, plan.id, planner, {})).ok).toBe(true);
    await expectRefused(plan.id, sam, `You started this revision on ${today()}${AUTHOR}`);
  });

  it("submitting it", async () => {
    const { sam, plan } = await setUp();
    const res = await callRoute(submit.action, await postForm(`/plans/${plan.id}/submit`, {}, sam), {
      planId: String(plan.id),
    });
    expect(res.status).toBe(302);
    await expectRefused(plan.id, sam, `You submitted it${AUTHOR}`);
    const current = (await PlanRevision.findOne({ where: { planId: plan.id } }))!;
    expect(current.status).toBe("in_review");
  });

  it("several acts by one person are all named", async () => {
    const { org, sam, plan } = await setUp();
    await resave(org, plan.id, sam);
    expect((await submitRevision(org, plan.id, sam, {})).ok).toBe(true);
    await expectRefused(plan.id, sam, `You saved this revision on ${today()} and you submitted it${AUTHOR}`);
  });
});
