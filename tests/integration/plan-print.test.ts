import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import * as print from "~/routes/plans.$planId.print.pdf";
import * as printPage from "~/routes/plans.$planId.print";
import * as verify from "~/routes/verify.$token";
import { AuditEvent } from "~/models/audit-event.server";
import { PlanRevision } from "~/models/plan.server";
import { recordLift, type LiftRecordInput } from "~/plans/lift.server";
import { PRE_LIFT_CHECKLIST } from "~/plans/workflow";
import { approveRevision, startNewRevision, submitRevision } from "~/plans/workflow.server";
import { callRoute, getRequest, makeUser, TEST_PASSWORD } from "../support/factories";
import { liftAsPlanned, readyPlan } from "../support/workflow";

async function printRequest(planId: number, user: { id: number }) {
  return callRoute(print.loader, await getRequest(`/plans/${planId}/print.pdf`, user), { planId: String(planId) });
}

function pdfText(bytes: Uint8Array) {
  const file = path.join(os.tmpdir(), `plumbline-print-${process.pid}-${Date.now()}.pdf`);
  fs.writeFileSync(file, bytes);
  try {
    return spawnSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" }).stdout;
  } finally {
    fs.rmSync(file, { force: true });
  }
}

describe("printing", () => {
  it("a draft cannot be printed: the PDF address sends to the app's own page, which says why (409) and links back", async () => {
    const { planner, plan } = await readyPlan();
    const res = await printRequest(plan.id, planner);
    expect(res.status).toBe(302);
    expect(res.headers.get("Location")).toBe(`/plans/${plan.id}/print`);
    const page = await callRoute(printPage.loader, await getRequest(`/plans/${plan.id}/print`, planner), {
      planId: String(plan.id),
    });
    expect(page.status).toBe(409);
    expect(page.data).toEqual({
      message:
        "The plan has no approved revision to print yet. Revision 1 is a draft: it prints once an appointed person has approved it.",
      planId: plan.id,
    });
  });

  it("the approved revision prints with the approver, its fingerprint and the caution, and the print is in the history", async () => {
    const { planner, approver, rigger, plan } = await readyPlan();
    const org = planner.organisationId;
    await submitRevision(org, plan.id, planner, {});
    await approveRevision(org, plan.id, approver, { password: TEST_PASSWORD, typedName: approver.name, comment: "" });
    const request = await getRequest(`/plans/${plan.id}/print.pdf`, rigger);
    const res = await print.loader({ request, params: { planId: String(plan.id) }, context: {} } as never);
    expect(res.status).toBe(200);
    expect(res.headers.get("Content-Type")).toBe("application/pdf");
    const bytes = new Uint8Array(await res.arrayBuffer());
    const text = pdfText(bytes).replace(/\s+/g, " ");
    const revision = (await PlanRevision.findOne({ where: { planId: plan.id } }))!;
    expect(text).toContain("Avery Approver");
    expect(text).toContain(revision.fingerprint!);
    expect(text).toMatch(/does not replace, the judgement of the appointed person/);
    expect(await AuditEvent.count({ where: { entity: "plan", entityId: plan.id, action: "printed" } })).toBe(1);
  });

  it("the QR page tells the truth once a newer revision is approved, and printing then gives the new revision", async () => {
    const { planner, approver, plan } = await readyPlan();
    const org = planner.organisationId;
    await submitRevision(org, plan.id, planner, {});
    await approveRevision(org, plan.id, approver, { password: TEST_PASSWORD, typedName: approver.name, comment: "" });
    const token = (await PlanRevision.findOne({ where: { planId: plan.id, revision: 1 } }))!.verifyToken!;
    const anonymous = await callRoute(verify.loader, new Request(`http://localhost:3000/verify/${token}`), { token });
    expect(anonymous.data).toMatchObject({ found: { status: "approved", revision: 1 }, canOpen: false });
    expect(JSON.stringify(anonymous.data)).not.toContain("fingerprint");

    await startNewRevision(org, plan.id, planner);
    expect((await printRequest(plan.id, planner)).status).toBe(200);
    await submitRevision(org, plan.id, planner, {});
    await approveRevision(org, plan.id, approver, { password: TEST_PASSWORD, typedName: approver.name, comment: "" });
    const after = await callRoute(verify.loader, await getRequest(`/verify/${token}`, planner), { token });
    expect(after.data).toMatchObject({ found: { status: "superseded", supersededByRevision: 2 }, canOpen: true });
    const reprinted = await print.loader({
      request: await getRequest(`/plans/${plan.id}/print.pdf`, planner),
      params: { planId: String(plan.id) },
      context: {},
    } as never);
    expect(pdfText(new Uint8Array(await reprinted.arrayBuffer()))).toMatch(/Revision 2/);
    const unknown = await callRoute(
      verify.loader,
      new Request("http://localhost:3000/verify/not-a-real-token-at-all"),
      { token: "not-a-real-token-at-all" },
    );
    expect(unknown.data).toEqual({ found: null, canOpen: false });
  });

  it("a completed plan prints its sealed plan, marked as the record of the lift it was made to", async () => {
    const { planner, approver, rigger, plan } = await readyPlan();
    const org = planner.organisationId;
    await submitRevision(org, plan.id, planner, {});
    await approveRevision(org, plan.id, approver, { password: TEST_PASSWORD, typedName: approver.name, comment: "" });
    const checklist = Object.fromEntries(PRE_LIFT_CHECKLIST.map((c) => [c.id, true])) as LiftRecordInput["checklist"];
    const lifted = await recordLift(org, plan.id, rigger, {
      form: await liftAsPlanned(plan.id),
      checklist,
      liftedAt: new Date("2025-06-02T09:15:00Z"),
      notes: "",
      nearMiss: false,
      nearMissDetails: "",
    });
    expect(lifted.ok).toBe(true);
    const request = await getRequest(`/plans/${plan.id}/print.pdf`, planner);
    const res = await print.loader({ request, params: { planId: String(plan.id) }, context: {} } as never);
    expect(res.status).toBe(200);
    const text = pdfText(new Uint8Array(await res.arrayBuffer())).replace(/\s+/g, " ");
    expect(text).toContain("COMPLETED");
    expect(text).toContain("LIFT COMPLETED 2025-06-02 09:15 UTC, recorded by Robin Rigger");
    expect(text).toContain(plan.title);
    expect(text).not.toContain("no approved revision");
  });

  it("another organisation cannot print the plan", async () => {
    const { planner, approver, plan } = await readyPlan();
    await submitRevision(planner.organisationId, plan.id, planner, {});
    await approveRevision(planner.organisationId, plan.id, approver, {
      password: TEST_PASSWORD,
      typedName: approver.name,
      comment: "",
    });
    const stranger = await makeUser(["rigger"]);
    expect((await printRequest(plan.id, stranger)).status).toBe(404);
  });
});
