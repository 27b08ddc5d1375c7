import { describe, expect, it } from "vitest";
import { CaughtMail } from "~/models/caught-mail.server";
import { getPlan, PlanRevision } from "~/models/plan.server";
import { savePlanRevision } from "~/plans/revisions.server";
import {
  approveRevision,
  assignRigger,
  cancelPlan,
  returnRevision,
  startNewRevision,
  submitRevision,
} from "~/plans/workflow.server";
import { verifyRevision } from "~/plans/verify.server";
import { getWorkflowView, listPlanHistory } from "~/plans/workflow-view.server";
import { recordLift } from "~/plans/lift.server";
import { PRE_LIFT_CHECKLIST } from "~/plans/workflow";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makePlan } from "../support/plans";
import { allowSelfApproval, liftAsPlanned, readyPlan } from "../support/workflow";

const allTicked = Object.fromEntries(PRE_LIFT_CHECKLIST.map((c) => [c.id, true])) as Record<
  (typeof PRE_LIFT_CHECKLIST)[number]["id"],
  boolean
>;

async function status(planId: number, org: number) {
  return (await getPlan(org, planId))!.revision.status;
}

async function mailTo(org: number, email: string) {
  return (await CaughtMail.findAll({ where: { organisationId: org } })).filter((m) => m.toAddress.includes(email));
}

describe("a plan moves from draft to completed", () => {
  it("planner submits, appointed person approves with password and name, rigger records the lift", async () => {
    const { planner, approver, rigger, plan } = await readyPlan();
    const org = planner.organisationId;
    expect((await submitRevision(org, plan.id, planner, {})).ok).toBe(true);
    expect(await status(plan.id, org)).toBe("in_review");
    expect((await mailTo(org, approver.email))[0]?.subject).toMatch(/Lift plan to review/);

    const approved = await approveRevision(org, plan.id, approver, {
      password: TEST_PASSWORD,
      typedName: " avery  approver ",
      comment: "Trial lift to 100 mm.",
    });
    expect(approved).toEqual({ ok: true, revision: 1, title: plan.title, plannerId: planner.id, selfApproved: false });
    const row = (await PlanRevision.findOne({ where: { planId: plan.id } }))!;
    expect(row.status).toBe("approved");
    expect(row.fingerprint).toMatch(/^[0-9a-f]{64}$/);
    expect(row.approverName).toBe("Avery Approver");
    expect((await mailTo(org, planner.email)).map((m) => m.subject)).toContain(
      `Lift plan approved: ${plan.title} (revision 1)`,
    );

    expect((await assignRigger(org, plan.id, approver, rigger.id)).ok).toBe(true);
    expect((await mailTo(org, rigger.email))[0]?.subject).toMatch(/Lift assigned to you/);

    expect(
      (
        await recordLift(org, plan.id, rigger, {
          form: await liftAsPlanned(plan.id),
          checklist: allTicked,
          liftedAt: new Date(Date.now() - 60_000),
          notes: "Landed on dowels first time.",
          nearMiss: false,
          nearMissDetails: "",
        })
      ).ok,
    ).toBe(true);
    expect(await status(plan.id, org)).toBe("completed");

    const history = (await listPlanHistory(org, plan.id)).map((h) => h.action);
    expect(history).toEqual(
      expect.arrayContaining([
        "created",
        "saved",
        "submitted for review",
        "approved",
        "rigger assigned",
        "lift recorded",
      ]),
    );
    expect(history.indexOf("approved")).toBeGreaterThan(history.indexOf("submitted for review"));
  });

  it("approval is refused on a wrong password or a name that is not the approver's, and nothing changes", async () => {
    const { planner, approver, plan } = await readyPlan();
    const org = planner.organisationId;
    await submitRevision(org, plan.id, planner, {});
    expect(
      await approveRevision(org, plan.id, approver, { password: "guess", typedName: approver.name, comment: "" }),
    ).toMatchObject({ ok: false, status: 400, field: "password" });
    expect(
      await approveRevision(org, plan.id, approver, {
        password: TEST_PASSWORD,
        typedName: "Someone Else",
        comment: "",
      }),
    ).toMatchObject({ ok: false, status: 400, field: "typedName" });
    expect(await status(plan.id, org)).toBe("in_review");
  });

  it("nobody approves their own plan unless the organisation allows it, and then the plan says so", async () => {
    const { planner, plan } = await readyPlan();
    const org = planner.organisationId;
    const both = await makeUser(["planner", "approver"], { organisationId: org, name: "Sam Both" });
    const found = (await getPlan(org, plan.id))!;
    await savePlanRevision(
      org,
      plan.id,
      found.revision.version,
      {
        title: plan.title,
        arrangement: found.revision.arrangement,
        rigging: found.revision.rigging,
        details: found.revision.details,
      },
      both.id,
    );
    await submitRevision(org, plan.id, both, {});
    const refused = await approveRevision(org, plan.id, both, {
      password: TEST_PASSWORD,
      typedName: "Sam Both",
      comment: "",
    });
    expect(refused).toMatchObject({ ok: false, status: 409 });
    if (refused.ok) return;
    expect(refused.message).toMatch(
      /^You saved this revision on \d{1,2} \w+ \d{4} and you submitted it, so you are an author of this revision: another appointed person must approve it\.$/,
    );
    await allowSelfApproval(both);
    const allowed = await approveRevision(org, plan.id, both, {
      password: TEST_PASSWORD,
      typedName: "Sam Both",
      comment: "",
    });
    expect(allowed).toMatchObject({ ok: true, selfApproved: true });
  });

  it("approval is refused, naming the item, while allocated gear is overdue for thorough examination", async () => {
    const { planner, approver, plan, gear } = await readyPlan();
    const org = planner.organisationId;
    await submitRevision(org, plan.id, planner, {});
    await gear.eyeboltA.update({ nextDueOn: "2001-01-01" });
    const refused = await approveRevision(org, plan.id, approver, {
      password: TEST_PASSWORD,
      typedName: approver.name,
      comment: "",
    });
    expect(refused.ok).toBe(false);
    if (refused.ok) return;
    expect(refused.message).toContain(gear.eyeboltA.itemCode);
    expect(await status(plan.id, org)).toBe("in_review");
  });

  it("a plan with a failing check cannot be submitted", async () => {
    const { planner, plan } = await readyPlan({ overdueEyebolt: true });
    const refused = await submitRevision(planner.organisationId, plan.id, planner, {});
    expect(refused).toMatchObject({ ok: false, status: 409 });
    expect(await status(plan.id, planner.organisationId)).toBe("draft");
  });

  it("a plan with no gear allocated cannot be submitted, though its leg angles are checked", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    const results = (await getPlan(planner.organisationId, plan.id))!.revision.results;
    expect(results.status === 200 && results.body.checks?.some((c) => c.id.startsWith("angle-"))).toBe(true);
    const refused = await submitRevision(planner.organisationId, plan.id, planner, {});
    expect(refused).toEqual({
      ok: false,
      status: 409,
      message: "No gear is allocated, so nothing has been checked: allocate the rigging before submitting.",
      field: undefined,
    });
    expect(await status(plan.id, planner.organisationId)).toBe("draft");
  });

  it("returned with comments goes back to the planner, who edits and resubmits", async () => {
    const { planner, approver, plan } = await readyPlan();
    const org = planner.organisationId;
    await submitRevision(org, plan.id, planner, {});
    expect(await returnRevision(org, plan.id, approver, "no")).toMatchObject({ ok: false, field: "comment" });
    expect((await returnRevision(org, plan.id, approver, "Use the 10 mm chain on both legs.")).ok).toBe(true);
    expect(await status(plan.id, org)).toBe("returned");
    expect(
      (await mailTo(org, planner.email)).some((m) => m.textBody.includes("Use the 10 mm chain on both legs.")),
    ).toBe(true);
    const found = (await getPlan(org, plan.id))!;
    const saved = await savePlanRevision(
      org,
      plan.id,
      found.revision.version,
      {
        title: plan.title,
        arrangement: found.revision.arrangement,
        rigging: found.revision.rigging,
        details: found.revision.details,
      },
      planner.id,
    );
    expect(saved.status).toBe("saved");
    expect(await status(plan.id, org)).toBe("draft");
    expect((await submitRevision(org, plan.id, planner, {})).ok).toBe(true);
  });

  it("an approved revision is frozen; a new revision supersedes it only when approved, and the QR token tells the truth", async () => {
    const { planner, approver, plan } = await readyPlan();
    const org = planner.organisationId;
    await submitRevision(org, plan.id, planner, {});
    await approveRevision(org, plan.id, approver, { password: TEST_PASSWORD, typedName: approver.name, comment: "" });
    const first = (await PlanRevision.findOne({ where: { planId: plan.id, revision: 1 } }))!;
    const frozen = await savePlanRevision(
      org,
      plan.id,
      first.version,
      { title: plan.title, ...(await getPlan(org, plan.id))!.revision },
      planner.id,
    );
    expect(frozen.status).toBe("frozen");

    expect(await startNewRevision(org, plan.id, planner)).toEqual({ ok: true, revision: 2 });
    expect((await startNewRevision(org, plan.id, planner)).ok).toBe(false);
    expect((await verifyRevision(first.verifyToken!))?.status).toBe("approved");
    await submitRevision(org, plan.id, planner, {});
    await approveRevision(org, plan.id, approver, { password: TEST_PASSWORD, typedName: approver.name, comment: "" });
    const verified = await verifyRevision(first.verifyToken!);
    expect(verified).toMatchObject({ status: "superseded", supersededByRevision: 2, revision: 1 });
    const view = (await getWorkflowView(org, plan.id, planner))!;
    expect(view.approved?.revision).toBe(2);
    expect(view.permissions.print.allowed).toBe(true);
  });

  it("the lift record needs every pre-lift check ticked and a rigger", async () => {
    const { planner, approver, rigger, plan } = await readyPlan();
    const org = planner.organisationId;
    await submitRevision(org, plan.id, planner, {});
    await approveRevision(org, plan.id, approver, { password: TEST_PASSWORD, typedName: approver.name, comment: "" });
    const missing = await recordLift(org, plan.id, rigger, {
      form: await liftAsPlanned(plan.id),
      checklist: { ...allTicked, "trial-lift": false },
      liftedAt: new Date(),
      notes: "",
      nearMiss: false,
      nearMissDetails: "",
    });
    expect(missing).toMatchObject({ ok: false, status: 400, field: "check-trial-lift" });
    const notRigger = await recordLift(org, plan.id, planner, {
      form: await liftAsPlanned(plan.id),
      checklist: allTicked,
      liftedAt: new Date(),
      notes: "",
      nearMiss: false,
      nearMissDetails: "",
    });
    expect(notRigger).toMatchObject({ ok: false, status: 403 });
    expect(await status(plan.id, org)).toBe("approved");
  });

  it("a cancelled plan cannot be printed or approved", async () => {
    const { planner, approver, plan } = await readyPlan();
    const org = planner.organisationId;
    await submitRevision(org, plan.id, planner, {});
    expect((await cancelPlan(org, plan.id, planner, "Customer postponed the overhaul.")).ok).toBe(true);
    expect(await status(plan.id, org)).toBe("cancelled");
    expect(
      (
        await approveRevision(org, plan.id, approver, {
          password: TEST_PASSWORD,
          typedName: approver.name,
          comment: "",
        })
      ).ok,
    ).toBe(false);
  });

  it("another organisation's plan is not found", async () => {
    const { plan } = await readyPlan();
    const stranger = await makeUser(["planner", "approver"]);
    expect(await submitRevision(stranger.organisationId, plan.id, stranger, {})).toMatchObject({
      ok: false,
      status: 404,
    });
  });
});
