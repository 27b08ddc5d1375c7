// The lift record as a document: sent from the lift page, it keeps who ticked each check and when, who
// released each hold point and when (site time), the gear confirmed on the hook and who was there; the
// plan page and the history show it with its photos, and it prints as its own PDF.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import * as history from "~/routes/plans.$planId.history";
import * as liftPage from "~/routes/plans.$planId.lift";
import * as liftRecordPdf from "~/routes/plans.$planId.lift-record.pdf";
import * as planPage from "~/routes/plans.$planId";
import { LiftRecord } from "~/models/lift-record.server";
import { PlanRevision } from "~/models/plan.server";
import { readLiftRecordDocument } from "~/plans/lift-record";
import { PRE_LIFT_CHECKLIST } from "~/plans/workflow";
import { approveRevision, assignRigger, submitRevision } from "~/plans/workflow.server";
import { callRoute, getRequest, TEST_PASSWORD } from "../support/factories";
import { PNG_BYTES, postMultipart } from "../support/gear";
import { readyPlan } from "../support/workflow";

function pdfText(bytes: Uint8Array) {
  const file = path.join(os.tmpdir(), `plumbline-record-${process.pid}-${Date.now()}.pdf`);
  fs.writeFileSync(file, bytes);
  try {
    return spawnSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" }).stdout.replace(/\s+/g, " ");
  } finally {
    fs.rmSync(file, { force: true });
  }
}

async function approved() {
  const ready = await readyPlan();
  const org = ready.planner.organisationId;
  expect((await submitRevision(org, ready.plan.id, ready.planner, {})).ok).toBe(true);
  expect(
    (
      await approveRevision(org, ready.plan.id, ready.approver, {
        password: TEST_PASSWORD,
        typedName: ready.approver.name,
        comment: "",
      })
    ).ok,
  ).toBe(true);
  await assignRigger(org, ready.plan.id, ready.approver, ready.rigger.id);
  return { ...ready, org };
}

describe("the lift record", () => {
  it("keeps who ticked and released what and when in site time, and shows and prints it with its photos", async () => {
    const { plan, rigger, planner, gear } = await approved();
    const params = { planId: String(plan.id) };
    const gearIds = Object.values(gear).map((g) => g.id);
    const fields: Record<string, string> = {
      ...Object.fromEntries(PRE_LIFT_CHECKLIST.map((c) => [`check-${c.id}`, "on"])),
      "check-briefing-at": "2025-06-02T12:40:00.000Z",
      ...Object.fromEntries(gearIds.map((id) => [`gear-${id}`, "on"])),
      "hold-2-by": "Dee Marchetti",
      "hold-2-at": "2025-06-02T13:50",
      "hold-3-by": "Dee Marchetti",
      "hold-3-at": "2025-06-02T13:55",
      timeZone: "Europe/London",
      liftedAt: "2025-06-02T14:05",
      notes: "Landed on the dowels first time.",
    };
    const lift = (f: Record<string, string>, files = {}) =>
      postMultipart(`/plans/${plan.id}/lift`, f, files, rigger).then((r) => callRoute(liftPage.action, r, params));

    // A hold point nobody released, or gear not confirmed on the hook, is refused and nothing is written.
    const unreleased: Record<string, string> = { ...fields };
    delete unreleased["hold-3-by"];
    expect(await lift(unreleased)).toMatchObject({ status: 400, data: { field: "hold-3-by" } });
    const unconfirmed: Record<string, string> = { ...fields };
    delete unconfirmed[`gear-${gear.slingB.id}`];
    const refused = await lift(unconfirmed);
    expect(refused).toMatchObject({ status: 400, data: { field: `gear-${gear.slingB.id}` } });
    expect((refused.data as { error: string }).error).toContain(`Confirm ${gear.slingB.itemCode} (Leg B sling)`);
    expect(await LiftRecord.count()).toBe(0);

    const photo = new PNG({ width: 4, height: 3 });
    photo.data.fill(128);
    const recorded = await lift(fields, {
      photos: { bytes: new Uint8Array(PNG.sync.write(photo)), name: "landed.png", type: "image/png" },
    });
    expect(recorded.status).toBe(302);

    const row = (await PlanRevision.findOne({ where: { planId: plan.id } }))!;
    expect(row.status).toBe("completed");
    const record = (await LiftRecord.findOne({ where: { revisionId: row.id } }))!;
    // 14:05 in London in June is BST, UTC+1 (The Summer Time Order 2002).
    expect(record.liftedAt.toISOString()).toBe("2025-06-02T13:05:00.000Z");
    const doc = readLiftRecordDocument(record.document)!;
    expect(doc.timeZone).toBe("Europe/London");
    expect(doc.ticks.find((t) => t.id === "briefing")).toEqual({
      id: "briefing",
      text: "Briefing held with everyone on the lift",
      by: "Robin Rigger",
      at: "2025-06-02T12:40:00.000Z",
    });
    expect(doc.holdPoints.map((h) => [h.step, h.releasedBy, h.at])).toEqual([
      [2, "Dee Marchetti", "2025-06-02T12:50:00.000Z"],
      [3, "Dee Marchetti", "2025-06-02T12:55:00.000Z"],
    ]);
    expect(doc.gear.map((g) => g.itemId).sort()).toEqual([...new Set(gearIds)].sort());

    // The plan page and the history show it, with the photo.
    const page = await callRoute(planPage.loader, await getRequest(`/plans/${plan.id}`, planner), params);
    const shown = (page.data as { workflow: { liftRecord: { photos: number[]; document: unknown } } }).workflow
      .liftRecord;
    expect(shown.photos).toHaveLength(1);
    expect(shown.document).toEqual(doc);
    const events = (
      (await callRoute(history.loader, await getRequest(`/plans/${plan.id}/history`, planner), params)).data as {
        events: Array<{ action: string; photos: number[]; details: Record<string, unknown> }>;
      }
    ).events;
    const recordedEvent = events.find((e) => e.action === "lift recorded")!;
    expect(recordedEvent.photos).toEqual(shown.photos);
    expect(recordedEvent.details.landed).toBe("2 June 2025 at 14:05 (Europe/London)");

    // Its own PDF.
    const request = await getRequest(`/plans/${plan.id}/lift-record.pdf`, planner);
    const res = (await liftRecordPdf.loader({ request, params, context: {} } as never)) as Response;
    expect(res.status).toBe(200);
    const text = pdfText(new Uint8Array(await res.arrayBuffer()));
    expect(text).toContain("LIFT RECORD");
    expect(text).toContain("2 June 2025 at 14:05 (Europe/London); 2025-06-02 13:05 UTC");
    expect(text).toContain("Briefing held with everyone on the lift Robin Rigger 2 June 2025 at 13:40 (Europe/London)");
    expect(text).toMatch(/2 Trial lift a short way off the floor and hold Dee Marchetti 2 June 2025 at 13:50/);
    expect(text).toContain(gear.eyeboltA.itemCode);
    expect(text).toContain("Landed on the dowels first time.");
    expect(text).not.toContain("could not be read");
  });

  it("a photo that only starts like a PNG is named in the PDF, never allowed to stop it", async () => {
    const { plan, rigger, gear } = await approved();
    const params = { planId: String(plan.id) };
    const fields = {
      ...Object.fromEntries(PRE_LIFT_CHECKLIST.map((c) => [`check-${c.id}`, "on"])),
      ...Object.fromEntries(Object.values(gear).map((g) => [`gear-${g.id}`, "on"])),
      "hold-2-by": "Dee Marchetti",
      "hold-2-at": "2025-06-02T13:50",
      "hold-3-by": "Dee Marchetti",
      "hold-3-at": "2025-06-02T13:55",
      liftedAt: "2025-06-02T14:05",
    };
    const request = await postMultipart(
      `/plans/${plan.id}/lift`,
      fields,
      { photos: { bytes: PNG_BYTES, name: "broken.png", type: "image/png" } },
      rigger,
    );
    expect((await callRoute(liftPage.action, request, params)).status).toBe(302);
    const res = (await liftRecordPdf.loader({
      request: await getRequest(`/plans/${plan.id}/lift-record.pdf`, rigger),
      params,
      context: {},
    } as never)) as Response;
    expect(res.status).toBe(200);
    const text = pdfText(new Uint8Array(await res.arrayBuffer()));
    expect(text).toContain("Photo 1 could not be read as an image");
    // No time zone from the page: the record keeps UTC and says so.
    expect(text).toContain("2 June 2025 at 14:05 (UTC)");
  });
});
