// A sealed revision's printed body is built on its first print and kept; later prints stamp only what is
// live (the band with the gear's state now, who printed it when) on the kept body, so the band still
// follows the register while the rest of the document is not built again.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import * as print from "~/routes/plans.$planId.print.pdf";
import * as itemPage from "~/routes/gear.$itemId";
import { PlanRevision } from "~/models/plan.server";
import { SealedPrintBody } from "~/models/sealed-print-body.server";
import { sealedBodiesBuilt } from "~/plans/pdf/build.server";
import { approveRevision, submitRevision } from "~/plans/workflow.server";
import { callRoute, getRequest, makeUser, postForm, TEST_PASSWORD } from "../support/factories";
import { readyPlan } from "../support/workflow";

function pdfTool(tool: string, bytes: Uint8Array, args: string[]) {
  const file = path.join(os.tmpdir(), `plumbline-kept-${process.pid}-${Date.now()}-${Math.random()}.pdf`);
  fs.writeFileSync(file, bytes);
  try {
    return spawnSync(tool, [...args, file, ...(tool === "pdftotext" ? ["-"] : [])], { encoding: "utf8" }).stdout;
  } finally {
    fs.rmSync(file, { force: true });
  }
}
const flatText = (bytes: Uint8Array) => pdfTool("pdftotext", bytes, ["-layout"]).replace(/\s+/g, " ");
const pageCount = (bytes: Uint8Array) => Number(/Pages:\s+(\d+)/.exec(pdfTool("pdfinfo", bytes, []))![1]);
const count = (text: string, phrase: string) => text.split(phrase).length - 1;

async function printPdf(planId: number, user: { id: number }) {
  const request = await getRequest(`/plans/${planId}/print.pdf`, user);
  const res = (await print.loader({ request, params: { planId: String(planId) }, context: {} } as never)) as Response;
  expect(res.status).toBe(200);
  return new Uint8Array(await res.arrayBuffer());
}

describe("printing a sealed revision again", () => {
  it("reuses the kept body, and the band still says NOT FIT TO LIFT once an allocated item is quarantined", async () => {
    const { planner, approver, rigger, plan, gear } = await readyPlan();
    const org = planner.organisationId;
    await submitRevision(org, plan.id, planner, {});
    await approveRevision(org, plan.id, approver, { password: TEST_PASSWORD, typedName: approver.name, comment: "" });

    // A body an older build kept for this revision is not used, and goes when the new one is kept.
    const revision = (await PlanRevision.findOne({ where: { planId: plan.id, status: "approved" } }))!;
    await SealedPrintBody.create({
      revisionId: revision.id,
      builder: "an-older-build",
      bodyKey: "0".repeat(64),
      body: Buffer.from("%PDF-1.7 not this one"),
    });
    const builtBefore = sealedBodiesBuilt();
    const first = await printPdf(plan.id, rigger);
    expect(sealedBodiesBuilt()).toBe(builtBefore + 1);
    expect(await SealedPrintBody.count()).toBe(1);
    expect(await SealedPrintBody.count({ where: { builder: "an-older-build" } })).toBe(0);
    const firstText = flatText(first);
    const pages = pageCount(first);
    expect(count(firstText, "FIT TO LIFT as checked")).toBe(pages);
    expect(firstText).not.toContain("NOT FIT TO LIFT");
    expect(count(firstText, "by Robin Rigger")).toBe(pages);

    const admin = await makeUser(["admin"], { organisationId: org, name: "Ada Admin" });
    const quarantined = await callRoute(
      itemPage.action,
      await postForm(
        `/gear/${gear.eyeboltA.id}`,
        { intent: "status", status: "quarantined", reason: "Thread damaged" },
        admin,
      ),
      { itemId: String(gear.eyeboltA.id) },
    );
    expect(quarantined.status).toBe(302);

    const second = await printPdf(plan.id, planner);
    // Not built again: the kept body was stamped.
    expect(sealedBodiesBuilt()).toBe(builtBefore + 1);
    expect(await SealedPrintBody.count()).toBe(1);
    // Stamped as an incremental update: the kept body's bytes go out unchanged, the stamp follows them.
    const kept = (await SealedPrintBody.findOne())!.body;
    expect(Buffer.from(second.subarray(0, kept.length)).equals(kept)).toBe(true);
    const secondText = flatText(second);
    expect(pageCount(second)).toBe(pages);
    expect(count(secondText, "NOT FIT TO LIFT as checked")).toBe(pages);
    expect(secondText).toContain(gear.eyeboltA.itemCode);
    expect(count(secondText, "by Pat Planner")).toBe(pages);
    expect(secondText).not.toContain("by Robin Rigger");
    // The sealed content is there as on the first print: the title, the approver, every page's number.
    expect(secondText).toContain(plan.title);
    expect(secondText).toContain("Avery Approver");
    expect(secondText).toContain(`Page ${pages} of ${pages}`);
  });
});
