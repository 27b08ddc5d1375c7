// Work made on a phone without signal and sent later: each piece is recorded once however often it arrives,
// and the server judges a lift record against the gear as it stood when the record was made.
import { randomUUID } from "node:crypto";
import { describe, expect, it } from "vitest";
import * as sync from "~/routes/api.sync";
import * as planPage from "~/routes/plans.$planId";
import { CaughtMail } from "~/models/caught-mail.server";
import { LiftRecord } from "~/models/lift-record.server";
import { OfflineSubmission } from "~/models/offline-submission.server";
import { PlanRevision } from "~/models/plan.server";
import { GearItem } from "~/models/gear-item.server";
import { changeGearStatus } from "~/gear/lifecycle.server";
import { PRE_LIFT_CHECKLIST } from "~/plans/workflow";
import { approveRevision, assignRigger, submitRevision } from "~/plans/workflow.server";
import { callRoute, getRequest, makeUser, TEST_PASSWORD } from "../support/factories";
import { postMultipart } from "../support/gear";
import { readyPlan } from "../support/workflow";

async function approved() {
  const ready = await readyPlan();
  const org = ready.planner.organisationId;
  expect((await submitRevision(org, ready.plan.id, ready.planner, {})).ok).toBe(true);
  const approval = await approveRevision(org, ready.plan.id, ready.approver, {
    password: TEST_PASSWORD,
    typedName: ready.approver.name,
    comment: "",
  });
  expect(approval.ok).toBe(true);
  await assignRigger(org, ready.plan.id, ready.approver, ready.rigger.id);
  return { ...ready, org };
}

/** The lift page's fields for a lift made as planned, landed at `landed` (UTC). */
function liftFields(gearIds: number[], landed: Date) {
  return {
    ...Object.fromEntries(PRE_LIFT_CHECKLIST.map((c) => [`check-${c.id}`, "on"])),
    ...Object.fromEntries(gearIds.map((id) => [`gear-${id}`, "on"])),
    "hold-2-by": "Dee Marchetti",
    "hold-2-at": landed.toISOString().slice(0, 16),
    "hold-3-by": "Dee Marchetti",
    "hold-3-at": landed.toISOString().slice(0, 16),
    timeZone: "UTC",
    liftedAt: landed.toISOString().slice(0, 16),
    notes: "Landed without signal in the plant room.",
  };
}

type Answer = { outcome: string; message: string; field?: string | null; changes?: Array<{ kind: string }> };

/** The mail about lift records arriving from phones, as the catcher holds it. */
const arrivalMail = async (org: number) =>
  (await CaughtMail.findAll({ where: { organisationId: org } })).filter((m) => /from a phone/.test(m.subject));

async function send(fields: Record<string, string>, user: { id: number }) {
  const result = await callRoute(sync.action, await postMultipart("/api/sync", fields, {}, user));
  return { status: result.status, answer: result.data as Answer };
}

describe("work sent from a phone without signal", () => {
  it("records a lift once however often it arrives, with when it was made and when it arrived", async () => {
    const { plan, rigger, gear, org } = await approved();
    const madeAt = new Date(Date.now() - 20 * 60_000);
    const envelope = { clientId: randomUUID(), kind: "lift", planId: String(plan.id), madeAt: madeAt.toISOString() };
    const fields = {
      ...envelope,
      ...liftFields(
        Object.values(gear).map((g) => g.id),
        madeAt,
      ),
    };

    const first = await send(fields, rigger);
    expect(first).toMatchObject({ status: 200, answer: { outcome: "recorded", changes: [] } });
    // The answer was lost on the way back and the phone sends the same piece again, twice.
    const again = await send(fields, rigger);
    const third = await send(fields, rigger);
    expect(again.answer.outcome).toBe("recorded");
    expect(again.answer.message).toContain("already arrived");
    expect(third.status).toBe(200);

    const revision = (await PlanRevision.findOne({ where: { planId: plan.id } }))!;
    expect(revision.status).toBe("completed");
    expect(await LiftRecord.count({ where: { revisionId: revision.id } })).toBe(1);
    const row = (await OfflineSubmission.findOne({ where: { clientId: envelope.clientId } }))!;
    expect(row.madeAt.toISOString()).toBe(madeAt.toISOString());
    expect(row.receivedAt.getTime()).toBeGreaterThan(madeAt.getTime());
    expect(row.liftRecordId).not.toBeNull();
    // Nothing changed in between: nobody needs a mail about it.
    expect(await arrivalMail(org)).toHaveLength(0);
  });

  it("keeps a record made while the plan was fit, and reports gear quarantined after it was made", async () => {
    const { plan, rigger, planner, gear, org } = await approved();
    const madeAt = new Date(Date.now() - 30 * 60_000);
    // A defect found after the lift, while the phone was still without signal.
    expect(
      (await changeGearStatus(org, gear.slingA.id, { status: "quarantined", reason: "Bent link" }, planner.id)).ok,
    ).toBe(true);
    const fields = {
      clientId: randomUUID(),
      kind: "lift",
      planId: String(plan.id),
      madeAt: madeAt.toISOString(),
      ...liftFields(
        Object.values(gear).map((g) => g.id),
        madeAt,
      ),
    };
    const sent = await send(fields, rigger);
    expect(sent.status).toBe(200);
    expect(sent.answer.outcome).toBe("recorded");
    expect(sent.answer.changes?.map((c) => c.kind)).toEqual(["quarantined"]);

    // The planner sees it on the plan page.
    const page = await callRoute(planPage.loader, await getRequest(`/plans/${plan.id}`, planner), {
      planId: String(plan.id),
    });
    const arrived = (page.data as { arrivedFromPhone: Array<{ outcome: string; changes: unknown[] }> })
      .arrivedFromPhone;
    expect(arrived).toHaveLength(1);
    expect(arrived[0]!.changes).toHaveLength(1);

    // And is told by mail, once, with the item that changed; the appointed person is not troubled with it.
    await send(fields, rigger);
    const mail = await arrivalMail(org);
    expect(mail).toHaveLength(1);
    expect(mail[0]!.toAddress).toContain(planner.email);
    expect(mail[0]!.subject).toMatch(/^Lift recorded from a phone, gear changed since/);
    expect(mail[0]!.textBody).toContain(gear.slingA.itemCode);
    expect(mail[0]!.textBody).toContain(`/plans/${plan.id}`);
  });

  it("refuses a record made after the gear was quarantined, keeps what was typed, and says so once", async () => {
    const { plan, rigger, planner, approver, gear, org } = await approved();
    expect((await changeGearStatus(org, gear.slingB.id, { status: "quarantined", reason: "Cut" }, planner.id)).ok).toBe(
      true,
    );
    const madeAt = new Date(Date.now() + 1000);
    const landed = new Date(Date.now() - 5 * 60_000);
    const fields = {
      clientId: randomUUID(),
      kind: "lift",
      planId: String(plan.id),
      madeAt: madeAt.toISOString(),
      ...liftFields(
        Object.values(gear).map((g) => g.id),
        landed,
      ),
    };
    const sent = await send(fields, rigger);
    expect(sent).toMatchObject({ status: 200, answer: { outcome: "refused" } });
    expect(sent.answer.message).toContain("NOT FIT TO LIFT");
    expect((await send(fields, rigger)).answer.outcome).toBe("refused");
    const revision = (await PlanRevision.findOne({ where: { planId: plan.id } }))!;
    expect(revision.status).toBe("approved");
    expect(await LiftRecord.count({ where: { revisionId: revision.id } })).toBe(0);
    const row = (await OfflineSubmission.findOne({ where: { clientId: fields.clientId } }))!;
    expect(JSON.parse(row.payload!)).toContainEqual(["notes", "Landed without signal in the plant room."]);

    // The planner and the appointed person who approved the plan are each told once, with the reason.
    const mail = await arrivalMail(org);
    expect(mail).toHaveLength(2);
    expect(mail.map((m) => m.toAddress)).toEqual(
      expect.arrayContaining([expect.stringContaining(planner.email), expect.stringContaining(approver.email)]),
    );
    for (const m of mail) {
      expect(m.subject).toMatch(/^Lift record from a phone NOT RECORDED/);
      expect(m.textBody).toContain("NOT FIT TO LIFT");
      expect(m.textBody).toContain(rigger.name);
    }
  });

  it("sends a record with a field to put right back as invalid, writes nothing, and takes it again corrected", async () => {
    const { plan, rigger, gear } = await approved();
    const madeAt = new Date(Date.now() - 60_000);
    const complete: Record<string, string> = {
      clientId: randomUUID(),
      kind: "lift",
      planId: String(plan.id),
      madeAt: madeAt.toISOString(),
      ...liftFields(
        Object.values(gear).map((g) => g.id),
        madeAt,
      ),
    };
    const missing = { ...complete };
    delete missing["hold-3-by"];
    const first = await send(missing, rigger);
    expect(first).toMatchObject({ status: 400, answer: { outcome: "invalid", field: "hold-3-by" } });
    expect(await OfflineSubmission.count({ where: { clientId: complete.clientId } })).toBe(0);
    expect((await send(complete, rigger)).answer.outcome).toBe("recorded");
  });

  it("records a defect report once and quarantines the item; refuses bad envelopes and other organisations' plans", async () => {
    const { plan, rigger, gear } = await approved();
    const report = {
      clientId: randomUUID(),
      kind: "defect",
      itemId: String(gear.slingA.id),
      madeAt: new Date(Date.now() - 60_000).toISOString(),
      defect: "Gouge on the third link from the hook",
    };
    expect((await send(report, rigger)).answer.outcome).toBe("recorded");
    expect((await send(report, rigger)).answer.outcome).toBe("recorded");
    expect(await OfflineSubmission.count({ where: { clientId: report.clientId } })).toBe(1);
    const item = (await GearItem.findByPk(gear.slingA.id))!;
    expect(item.status).toBe("quarantined");

    expect((await send({ ...report, clientId: "x" }, rigger)).status).toBe(400);
    expect((await send({ ...report, clientId: randomUUID(), madeAt: "yesterday" }, rigger)).status).toBe(400);
    const future = new Date(Date.now() + 3_600_000).toISOString();
    expect((await send({ ...report, clientId: randomUUID(), madeAt: future }, rigger)).status).toBe(400);
    const stranger = await makeUser(["rigger"]);
    const elsewhere = await send(
      { clientId: randomUUID(), kind: "lift", planId: String(plan.id), madeAt: new Date().toISOString() },
      stranger,
    );
    expect(elsewhere.status).toBe(404);
  });
});
