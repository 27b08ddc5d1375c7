// The gear's state now beside an approved plan: quarantining an allocated item makes the plan NOT FIT
// TO LIFT wherever it is seen (verify page, lift page, plan page, print), refuses the lift record on
// the server, and mails the planner, the appointed person and the assigned rigger, one message each.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import * as itemPage from "~/routes/gear.$itemId";
import * as gearEdit from "~/routes/gear.$itemId.edit";
import * as liftPage from "~/routes/plans.$planId.lift";
import * as planPage from "~/routes/plans.$planId";
import * as print from "~/routes/plans.$planId.print.pdf";
import * as verify from "~/routes/verify.$token";
import { CaughtMail } from "~/models/caught-mail.server";
import { GearItem, toFormValues } from "~/models/gear-item.server";
import { LiftRecord } from "~/models/lift-record.server";
import { PlanRevision } from "~/models/plan.server";
import { PRE_LIFT_CHECKLIST } from "~/plans/workflow";
import { approveRevision, assignRigger, submitRevision } from "~/plans/workflow.server";
import { callRoute, getRequest, makeUser, postForm, TEST_PASSWORD } from "../support/factories";
import { makeGear } from "../support/plans";
import { readyPlan } from "../support/workflow";

function pdfPages(bytes: Uint8Array): string[] {
  const file = path.join(os.tmpdir(), `plumbline-live-${process.pid}-${Date.now()}.pdf`);
  fs.writeFileSync(file, bytes);
  try {
    const text = spawnSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" }).stdout;
    return text
      .split("\f")
      .filter((p) => p.trim() !== "")
      .map((p) => p.replace(/\s+/g, " "));
  } finally {
    fs.rmSync(file, { force: true });
  }
}

async function approvedAndAssigned() {
  const ready = await readyPlan();
  const { planner, approver, rigger, plan } = ready;
  const org = planner.organisationId;
  expect((await submitRevision(org, plan.id, planner, {})).ok).toBe(true);
  expect(
    (await approveRevision(org, plan.id, approver, { password: TEST_PASSWORD, typedName: approver.name, comment: "" }))
      .ok,
  ).toBe(true);
  expect((await assignRigger(org, plan.id, approver, rigger.id)).ok).toBe(true);
  const token = (await PlanRevision.findOne({ where: { planId: plan.id, status: "approved" } }))!.verifyToken!;
  return { ...ready, org, token };
}

const notFitMail = async (org: number) =>
  (await CaughtMail.findAll({ where: { organisationId: org } })).filter((m) => m.subject.startsWith("NOT FIT TO LIFT"));

describe("an allocated item of an approved plan is quarantined", () => {
  it("makes the plan not fit to lift everywhere, refuses the lift record and mails the three people on it", async () => {
    const { planner, approver, rigger, plan, gear, org, token } = await approvedAndAssigned();
    const params = { planId: String(plan.id) };

    // Fit to start with, with the time it was checked.
    const fit = await callRoute(verify.loader, new Request(`http://localhost:3000/verify/${token}`), { token });
    expect(fit.data).toMatchObject({ found: { status: "approved", live: { fit: true, problems: [] } } });
    expect(await notFitMail(org)).toHaveLength(0);

    // The rigger reports a defect on the eyebolt at A, which quarantines it.
    const reported = await callRoute(
      itemPage.action,
      await postForm(`/gear/${gear.eyeboltA.id}`, { intent: "defect", defect: "Eye bent, thread galled" }, rigger),
      { itemId: String(gear.eyeboltA.id) },
    );
    expect(reported.status).toBe(302);

    const mails = await notFitMail(org);
    expect(mails).toHaveLength(3);
    for (const person of [planner, approver, rigger])
      expect(
        mails.filter((m) => m.toAddress.includes(person.email)),
        person.name,
      ).toHaveLength(1);
    for (const m of mails) {
      expect(m.subject).toBe(`NOT FIT TO LIFT: ${plan.title} (revision 1)`);
      expect(m.textBody).toContain(`${gear.eyeboltA.itemCode} (Leg A eyebolt) has been quarantined since`);
      expect(m.textBody).toContain("Eye bent, thread galled");
    }

    // The verify page says so first, naming the item and since when; the defect itself only to the organisation.
    const anonymous = await callRoute(verify.loader, new Request(`http://localhost:3000/verify/${token}`), { token });
    const live = (anonymous.data as { found: { live: { fit: boolean; problems: Array<Record<string, unknown>> } } })
      .found.live;
    expect(live.fit).toBe(false);
    expect(live.problems).toEqual([
      expect.objectContaining({
        itemCode: gear.eyeboltA.itemCode,
        position: "Leg A eyebolt",
        kind: "quarantined",
        since: expect.stringMatching(/^\d{4}-\d{2}-\d{2}T/),
        detail: "",
      }),
    ]);
    const member = await callRoute(verify.loader, await getRequest(`/verify/${token}`, planner), { token });
    expect(JSON.stringify(member.data)).toContain("Eye bent, thread galled");

    // The lift page shows it and offers no record; the plan page too.
    const lift = await callRoute(liftPage.loader, await getRequest(`/plans/${plan.id}/lift`, rigger), params);
    expect(lift.data).toMatchObject({ live: { fit: false }, canRecord: false });
    expect((lift.data as { recordRefusal: string }).recordRefusal).toMatch(/^NOT FIT TO LIFT: /);
    const page = await callRoute(planPage.loader, await getRequest(`/plans/${plan.id}`, planner), params);
    expect(page.data).toMatchObject({
      workflow: { live: { fit: false }, permissions: { "record-lift": { allowed: false } } },
    });

    // The server refuses the record, whatever the form says.
    const ticked = Object.fromEntries(PRE_LIFT_CHECKLIST.map((c) => [`check-${c.id}`, "on"]));
    const refused = await callRoute(
      liftPage.action,
      await postForm(`/plans/${plan.id}/lift`, { ...ticked, notes: "Lifted anyway" }, rigger),
      params,
    );
    expect(refused.status).toBe(409);
    expect((refused.data as { error: string }).error).toMatch(
      new RegExp(`^NOT FIT TO LIFT: ${gear.eyeboltA.itemCode} \\(Leg A eyebolt\\) has been quarantined since`),
    );
    expect((await PlanRevision.findOne({ where: { planId: plan.id, revision: 1 } }))!.status).toBe("approved");
    const revision = (await PlanRevision.findOne({ where: { planId: plan.id, revision: 1 } }))!;
    expect(await LiftRecord.count({ where: { revisionId: revision.id } })).toBe(0);

    // The print carries it across every page.
    const request = await getRequest(`/plans/${plan.id}/print.pdf`, rigger);
    const res = (await print.loader({ request, params, context: {} } as never)) as Response;
    expect(res.status).toBe(200);
    const pages = pdfPages(new Uint8Array(await res.arrayBuffer()));
    expect(pages.length).toBeGreaterThan(1);
    for (const [i, text] of pages.entries()) {
      expect(text, `page ${i + 1}`).toContain("NOT FIT TO LIFT as checked");
      expect(text, `page ${i + 1}`).toContain(`${gear.eyeboltA.itemCode} (Leg A eyebolt) has been quarantined since`);
    }

    // Reporting another defect on the item already quarantined is not news: no more mail.
    await callRoute(
      itemPage.action,
      await postForm(`/gear/${gear.eyeboltA.id}`, { intent: "defect", defect: "Also the collar is cracked" }, rigger),
      { itemId: String(gear.eyeboltA.id) },
    );
    expect(await notFitMail(org)).toHaveLength(3);
  });

  it("an item overdue for examination on the lift day, or changed since approval, is caught too; an unrelated item is not", async () => {
    const { planner, rigger, gear, org, token } = await approvedAndAssigned();
    const unrelated = await makeGear(org, "shackle", { wllKg: 2000 });
    await unrelated.update({ status: "quarantined" });
    const fine = await callRoute(verify.loader, await getRequest(`/verify/${token}`, planner), { token });
    expect(fine.data).toMatchObject({ found: { live: { fit: true } } });

    await gear.slingB.update({ nextDueOn: "2001-01-01" });
    await gear.crane.update({ wllKg: 8000, wllValue: 8000 });
    const verified = await callRoute(verify.loader, await getRequest(`/verify/${token}`, rigger), { token });
    const problems = (
      verified.data as { found: { live: { problems: Array<{ kind: string; itemCode: string; message: string }> } } }
    ).found.live.problems;
    expect(problems.map((p) => [p.kind, p.itemCode])).toEqual([
      ["overdue", gear.slingB.itemCode],
      ["changed", gear.crane.itemCode],
    ]);
    expect(problems[0]!.message).toContain("was due 2001-01-01");
    expect(problems[1]!.message).toContain("its WLL is now 8,000 kg (was 10,000 kg)");
  });

  it("an edit of an allocated item's WLL through the gear form mails the three people; a later description edit does not", async () => {
    const { plan, gear, org } = await approvedAndAssigned();
    const admin = await makeUser(["admin"], { organisationId: org, name: "Ada Admin" });
    const link = (await GearItem.findByPk(gear.masterLink.id))!;
    const { id: _id, ...values } = toFormValues(link);
    const fields = (changes: Record<string, string>) => ({
      ...Object.fromEntries(Object.entries(values).map(([k, v]) => [k, v === null ? "" : String(v)])),
      ...changes,
    });
    const edit = async (changes: Record<string, string>) =>
      callRoute(gearEdit.action, await postForm(`/gear/${link.id}/edit`, fields(changes), admin), {
        itemId: String(link.id),
      });
    expect((await edit({ wllValue: "5000" })).status).toBe(302);
    const mails = await notFitMail(org);
    expect(mails).toHaveLength(3);
    expect(mails[0]!.textBody).toContain(
      `${link.itemCode} (Master link) has changed since approval: its WLL is now 5,000 kg (was 6,700 kg)`,
    );
    expect((await edit({ wllValue: "5000", description: "Repainted" })).status).toBe(302);
    expect(await notFitMail(org)).toHaveLength(3);
    expect(mails[0]!.subject).toBe(`NOT FIT TO LIFT: ${plan.title} (revision 1)`);
  });
});
