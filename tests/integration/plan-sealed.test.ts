// Approval seals the revision: everything its print shows is stored once, so changing every live row
// the plan refers to afterwards (gear, the plan's title through a new revision, the component, the
// site, the job) changes nothing printed outside the band that reports the gear's state now.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import * as print from "~/routes/plans.$planId.print.pdf";
import * as verify from "~/routes/verify.$token";
import { getComponent, toDefinition, updateComponent } from "~/models/component.server";
import { GearItem, toFormValues, updateGearItem } from "~/models/gear-item.server";
import { getJob, updateJob } from "~/models/job.server";
import { getPlan, PlanRevision } from "~/models/plan.server";
import { updateSite } from "~/models/site.server";
import { LIVE_BAND_H } from "~/plans/pdf/live-band.server";
import { savePlanRevision } from "~/plans/revisions.server";
import { fingerprintOf } from "~/plans/seal.server";
import { readSealed } from "~/plans/sealed";
import { approveRevision, assignRigger, startNewRevision, submitRevision } from "~/plans/workflow.server";
import { callRoute, getRequest, makeUser, TEST_PASSWORD } from "../support/factories";
import { readyPlan } from "../support/workflow";

type Word = { page: number; text: string; x: number; y: number };

/** Every word of the PDF with its page and position (pdftotext -bbox, pt from the top left). */
function words(bytes: Uint8Array): Word[] {
  const file = path.join(os.tmpdir(), `plumbline-sealed-${process.pid}-${Date.now()}-${Math.random()}.pdf`);
  fs.writeFileSync(file, bytes);
  try {
    const html = spawnSync("pdftotext", ["-bbox", file, "-"], { encoding: "utf8" }).stdout;
    const pages = [...html.matchAll(/<page width="[\d.]+" height="[\d.]+">([\s\S]*?)<\/page>/g)];
    return pages.flatMap(([, body], page) =>
      [...body!.matchAll(/xMin="([\d.-]+)" yMin="([\d.-]+)" xMax="[\d.-]+" yMax="[\d.-]+">([^<]*)</g)].map((m) => ({
        page: page + 1,
        text: m[3]!,
        x: Math.round(Number(m[1])),
        y: Math.round(Number(m[2])),
      })),
    );
  } finally {
    fs.rmSync(file, { force: true });
  }
}

/**
 * The printed words outside what is live: the band under the header (found by its heading, "FIT TO
 * LIFT" or "NOT FIT TO LIFT", and its fixed height) and the "Printed <when> by <whom>" line.
 */
function sealedWords(all: Word[]) {
  const out: Word[] = [];
  for (const page of [...new Set(all.map((w) => w.page))]) {
    const onPage = all.filter((w) => w.page === page);
    const heading = onPage.find(
      (w, i) => w.text === "LIFT" && onPage[i - 1]?.text === "TO" && onPage[i - 2]?.text === "FIT",
    );
    if (!heading) throw new Error(`page ${page} has no band`);
    const top = heading.y - 5;
    out.push(...onPage.filter((w) => !(w.y >= top && w.y <= top + LIVE_BAND_H + 1) && !(w.y > 805 && w.x < 220)));
  }
  return out;
}

async function printPdf(planId: number, user: { id: number }) {
  const request = await getRequest(`/plans/${planId}/print.pdf`, user);
  const res = (await print.loader({ request, params: { planId: String(planId) }, context: {} } as never)) as Response;
  expect(res.status).toBe(200);
  return new Uint8Array(await res.arrayBuffer());
}

const text = (ws: Word[]) => ws.map((w) => w.text).join(" ");

describe("the sealed record of an approved revision", () => {
  it("prints the same words in the same places after every live row it names has changed, apart from the live band", async () => {
    const { planner, approver, rigger, plan, gear } = await readyPlan();
    const org = planner.organisationId;
    const admin = await makeUser(["admin"], { organisationId: org, name: "Ada Admin" });
    expect((await submitRevision(org, plan.id, planner, {})).ok).toBe(true);
    expect(
      (
        await approveRevision(org, plan.id, approver, {
          password: TEST_PASSWORD,
          typedName: approver.name,
          comment: "Go.",
        })
      ).ok,
    ).toBe(true);
    await assignRigger(org, plan.id, approver, rigger.id);

    const row = (await PlanRevision.findOne({ where: { planId: plan.id, revision: 1 } }))!;
    const sealed = readSealed(row.sealed)!;
    // The fingerprint is the SHA-256 of exactly the stored record.
    expect(row.fingerprint).toBe(fingerprintOf(sealed));
    expect(sealed.schedule.map((s) => s.itemCode)).toEqual(
      expect.arrayContaining([
        gear.eyeboltA.itemCode,
        gear.slingA.itemCode,
        gear.masterLink.itemCode,
        gear.crane.itemCode,
      ]),
    );

    const before = words(await printPdf(plan.id, rigger));
    expect(text(before)).toContain("FIT TO LIFT as checked");
    expect(text(before)).not.toContain("NOT FIT TO LIFT");

    // Change every live row the plan refers to.
    const found = (await getPlan(org, plan.id))!;
    const eyebolt = (await GearItem.findByPk(gear.eyeboltA.id))!;
    const { id: _id, ...eyeboltInput } = toFormValues(eyebolt);
    await updateGearItem(
      org,
      eyebolt.id,
      { ...eyeboltInput, itemCode: "EB-RENAMED", wllValue: 2500, description: "Renamed and re-rated" },
      admin.id,
    );
    const sling = (await GearItem.findByPk(gear.slingB.id))!;
    const { id: _sid, ...slingInput } = toFormValues(sling);
    await updateGearItem(org, sling.id, { ...slingInput, description: "Another description entirely" }, admin.id);
    const component = (await getComponent(org, found.revision.componentId!))!;
    expect(
      await updateComponent(
        org,
        component.id,
        { ...toDefinition(component), name: "Renamed component", massKg: 2400 },
        component.version,
        planner.id,
      ),
    ).not.toBeNull();
    const job = (await getJob(org, plan.jobId))!;
    await updateJob(
      org,
      job.id,
      {
        siteId: job.siteId,
        workOrder: "WO-CHANGED",
        title: "Changed job",
        description: "",
        status: "open",
        startsOn: null,
      },
      admin.id,
    );
    await updateSite(
      org,
      job.siteId,
      { name: "Renamed site", customer: "Renamed customer", address: "Elsewhere", siteContact: "", notes: "" },
      admin.id,
    );
    expect((await startNewRevision(org, plan.id, planner)).ok).toBe(true);
    const draft = (await getPlan(org, plan.id))!;
    const saved = await savePlanRevision(
      org,
      plan.id,
      draft.revision.version,
      {
        title: "A new title for revision 2",
        arrangement: draft.revision.arrangement,
        rigging: draft.revision.rigging,
        details: draft.revision.details,
      },
      planner.id,
    );
    expect(saved.status).toBe("saved");
    expect((await getPlan(org, plan.id))!.plan.title).toBe("A new title for revision 2");

    const after = words(await printPdf(plan.id, rigger));
    const t = text(after);
    // The band reports the gear now on every page...
    const pages = Math.max(...after.map((w) => w.page));
    for (let p = 1; p <= pages; p++)
      expect(text(after.filter((w) => w.page === p)), `page ${p}`).toMatch(/NOT FIT TO LIFT as checked/);
    expect(t).toContain("EB-RENAMED");
    // ...and everything else is exactly as sealed: the old title, item ids, WLLs, descriptions, component, job, site.
    expect(sealedWords(after)).toEqual(sealedWords(before));
    const printed = text(sealedWords(after));
    expect(printed).toContain(plan.title);
    expect(printed).not.toContain("A new title");
    expect(printed).toContain(gear.eyeboltA.itemCode);
    expect(printed).not.toContain("Renamed");
    expect(printed).not.toContain("WO-CHANGED");

    // The verify page names the plan as sealed too, and finds the record intact.
    const token = row.verifyToken!;
    const verified = await callRoute(verify.loader, await getRequest(`/verify/${token}`, planner), { token });
    expect(verified.data).toMatchObject({
      found: { title: plan.title, site: "Test site (Test customer)", revision: 1, intact: true, live: { fit: false } },
    });
  });
});
