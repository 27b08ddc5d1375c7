// The load as planned: the plan lifts the component's mass and CoG unless the planner overrides them
// with a reason; the override is refused without one or with a CoG outside the outline, and once taken
// it is marked wherever the load is shown, written to the audit trail and sealed at approval.
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { describe, expect, it } from "vitest";
import * as planApi from "~/routes/api.plans.$planId";
import * as planPage from "~/routes/plans.$planId";
import * as history from "~/routes/plans.$planId.history";
import * as print from "~/routes/plans.$planId.print.pdf";
import * as review from "~/routes/plans.$planId.review";
import { listAuditEvents } from "~/models/audit-event.server";
import { getComponent } from "~/models/component.server";
import { PlanRevision } from "~/models/plan.server";
import { fingerprintOf } from "~/plans/seal.server";
import { readSealed } from "~/plans/sealed";
import * as verify from "~/routes/verify.$token";
import { approveRevision, submitRevision } from "~/plans/workflow.server";
import { callRoute, getRequest, TEST_PASSWORD } from "../support/factories";
import { jsonRequest } from "../support/plans";
import { readyPlan } from "../support/workflow";
import * as migration from "../../db/migrations/0024-plan-load-overrides";
import { sequelize } from "~/utils/db.server";
import { getPlan } from "~/models/plan.server";

type PlanJson = {
  version: number;
  title: string;
  arrangement: unknown;
  rigging: unknown;
  details: unknown;
  snapshot: { massKg: number; cog: { x: number; y: number; z: number } };
  componentLoad: { massKg: number; cog: { x: number; y: number; z: number } };
  loadOverride: { massKg: number | null; cog: { x: number } | null; reason: string } | null;
  results: {
    status: number;
    body: {
      legs: Array<{ liftPointId: string; verticalShare: number; tensionKg: number; angleFromVerticalDeg: number }>;
    };
  };
};

const REASON = "Weighed on the crane scale before the lift: the drive end coupling has been removed";

async function load(planId: number, user: { id: number }) {
  return (await callRoute(planApi.loader, await getRequest(`/api/plans/${planId}`, user), { planId: String(planId) }))
    .data as PlanJson;
}

async function put(planId: number, user: { id: number }, before: PlanJson, loadEdit: unknown) {
  const payload = {
    version: before.version,
    title: before.title,
    arrangement: before.arrangement,
    rigging: before.rigging,
    details: before.details,
    load: loadEdit,
  };
  return callRoute(planApi.action, await jsonRequest(`/api/plans/${planId}`, payload, user, "PUT"), {
    planId: String(planId),
  });
}

function pdfText(bytes: Uint8Array) {
  const file = path.join(os.tmpdir(), `plumbline-override-${process.pid}-${Date.now()}.pdf`);
  fs.writeFileSync(file, bytes);
  try {
    return spawnSync("pdftotext", ["-layout", file, "-"], { encoding: "utf8" }).stdout.replace(/\s+/g, " ");
  } finally {
    fs.rmSync(file, { force: true });
  }
}

const lifted = { liftPoints: [] };

describe("overriding the component's mass and CoG in a plan", () => {
  it("refuses a CoG moved without an override, an override without a reason and a CoG outside the outline, writing nothing", async () => {
    const { planner, plan } = await readyPlan();
    const before = await load(plan.id, planner);

    // The editor's old way: the CoG moved 500 mm (one coarse keypress) with no reason.
    const moved = await put(plan.id, planner, before, { ...lifted, cog: { x: 0.5, y: 0, z: 0.5 } });
    expect(moved.status).toBe(400);
    expect((moved.data as { error: string }).error).toMatch(/follows the component unless it is overridden/);

    const noReason = await put(plan.id, planner, before, {
      ...lifted,
      override: { massKg: 2300, cog: null, reason: "   " },
    });
    expect(noReason.status).toBe(400);
    expect((noReason.data as { error: string }).error).toMatch(/Give the reason for overriding/);

    // The element is 1800 mm long (x from -900 to 900 mm): 950 mm is outside, refused with the component form's words.
    const outside = await put(plan.id, planner, before, {
      ...lifted,
      override: { massKg: null, cog: { x: 0.95, y: 0, z: 0.5 }, reason: REASON },
    });
    expect(outside.status).toBe(400);
    expect((outside.data as { error: string }).error).toContain(
      "The CoG lies outside the component's outline along x; check the figure and the datum.",
    );

    const same = await put(plan.id, planner, before, {
      ...lifted,
      override: { massKg: 2000, cog: null, reason: REASON },
    });
    expect(same.status).toBe(400);
    expect((same.data as { error: string }).error).toMatch(/nothing to override/);

    const after = await load(plan.id, planner);
    expect(after.version).toBe(before.version);
    expect(after.loadOverride).toBeNull();
    expect(after.snapshot.cog).toEqual(after.componentLoad.cog);
    const events = await listAuditEvents(planner.organisationId, "plan", plan.id);
    expect(events.filter((e) => e.action.startsWith("load override"))).toEqual([]);
  });

  it("takes an override with a reason: the figures follow it, it is marked, audited and sealed, and printed beside the component's", async () => {
    const { planner, approver, plan } = await readyPlan();
    const org = planner.organisationId;
    const before = await load(plan.id, planner);
    const res = await put(plan.id, planner, before, {
      ...lifted,
      override: { massKg: 2400, cog: { x: 0.4, y: 0, z: 0.5 }, reason: REASON },
    });
    expect(res.status).toBe(200);
    const after = res.data as PlanJson;
    expect(after.snapshot.massKg).toBe(2400);
    expect(after.snapshot.cog.x).toBe(0.4);
    expect(after.componentLoad).toEqual({ massKg: 2000, cog: { x: 0, y: 0, z: 0.5 } });
    expect(after.loadOverride?.reason).toBe(REASON);
    // Lever rule (common practice): G 1.2 m from A and 0.4 m from B on a 1.6 m span puts 3/4 of the weight on B.
    const legB = after.results.body.legs.find((l) => l.liftPointId === "B")!;
    expect(legB.verticalShare).toBeCloseTo(0.75, 9);
    // The planned mass carries: the vertical component of B's tension is 3/4 of 2400 kg (force balance, common practice).
    expect(legB.tensionKg * Math.cos((legB.angleFromVerticalDeg * Math.PI) / 180)).toBeCloseTo(0.75 * 2400, 6);
    // The component itself is not touched.
    const component = (await getComponent(
      org,
      (await PlanRevision.findOne({ where: { planId: plan.id } }))!.componentId!,
    ))!;
    expect(component.massKg).toBe(2000);
    expect(component.cogXM).toBe(0);

    // Audit trail: old and new figures and the reason.
    const events = await listAuditEvents(org, "plan", plan.id);
    const set = events.find((e) => e.action === "load override set");
    expect(set).toBeDefined();
    const details = JSON.parse(set!.details!) as Record<string, unknown>;
    expect(details).toMatchObject({
      oldMassKg: 2000,
      newMassKg: 2400,
      oldCog: { x: 0, y: 0, z: 0.5 },
      newCog: { x: 0.4, y: 0, z: 0.5 },
      reason: REASON,
    });

    // The plan page and the review page mark it with both figures.
    const page = await callRoute(planPage.loader, await getRequest(`/plans/${plan.id}`, planner), {
      planId: String(plan.id),
    });
    const pageMark = (page.data as { revision: { loadOverrideMark: unknown } }).revision.loadOverrideMark;
    expect(pageMark).toEqual({
      mass: { componentKg: 2000, plannedKg: 2400 },
      cog: { component: { x: 0, y: 0, z: 0.5 }, planned: { x: 0.4, y: 0, z: 0.5 } },
      reason: REASON,
    });

    expect((await submitRevision(org, plan.id, planner, {})).ok).toBe(true);
    const reviewed = await callRoute(review.loader, await getRequest(`/plans/${plan.id}/review`, approver), {
      planId: String(plan.id),
    });
    expect((reviewed.data as { revision: { loadOverride: unknown } }).revision.loadOverride).toEqual(pageMark);
    expect(
      (
        await approveRevision(org, plan.id, approver, {
          password: TEST_PASSWORD,
          typedName: approver.name,
          comment: "",
        })
      ).ok,
    ).toBe(true);

    // Sealed: the load as planned and the mark, under the fingerprint.
    const row = (await PlanRevision.findOne({ where: { planId: plan.id, revision: 1 } }))!;
    const sealed = readSealed(row.sealed)!;
    expect(sealed.snapshot.massKg).toBe(2400);
    expect(sealed.loadOverride).toEqual(pageMark);
    expect(row.fingerprint).toBe(fingerprintOf(sealed));

    // Printed beside the component's figures, with the reason.
    const request = await getRequest(`/plans/${plan.id}/print.pdf`, planner);
    const pdf = (await print.loader({
      request,
      params: { planId: String(plan.id) },
      context: {},
    } as never)) as Response;
    expect(pdf.status).toBe(200);
    const text = pdfText(new Uint8Array(await pdf.arrayBuffer()));
    expect(text).toContain("Differs from the component");
    expect(text).toContain("Mass differs from the component: 2,400 kg as planned, 2,000 kg on the component.");
    expect(text).toContain(
      "CoG differs from the component: (400 mm, 0 mm, 500 mm) as planned, (0 mm, 0 mm, 500 mm) on the component.",
    );
    expect(text).toContain(`Reason for the override: ${REASON}`);
    expect(text).not.toContain("Nameplate or manufacturer's certificate");

    // The printed code's page says the same to whoever scans it, signed in or not.
    const scanned = await callRoute(verify.loader, new Request(`http://localhost/verify/${row.verifyToken}`), {
      token: row.verifyToken!,
    });
    expect((scanned.data as { found: { loadOverride: unknown } }).found.loadOverride).toEqual(pageMark);
  });

  it("removing the override returns the plan to the component's figures, and says so in the audit trail", async () => {
    const { planner, plan } = await readyPlan();
    const before = await load(plan.id, planner);
    const set = await put(plan.id, planner, before, { ...lifted, override: { massKg: 2200, reason: REASON } });
    expect(set.status).toBe(200);
    expect((set.data as PlanJson).snapshot.massKg).toBe(2200);
    const removed = await put(plan.id, planner, set.data as PlanJson, { ...lifted, override: null });
    expect(removed.status).toBe(200);
    expect((removed.data as PlanJson).snapshot.massKg).toBe(2000);
    expect((removed.data as PlanJson).loadOverride).toBeNull();
    const events = await listAuditEvents(planner.organisationId, "plan", plan.id);
    const gone = events.find((e) => e.action === "load override removed");
    // The plan's history page lists both, with the figures and the reason.
    const shown = await callRoute(history.loader, await getRequest(`/plans/${plan.id}/history`, planner), {
      planId: String(plan.id),
    });
    const listed = (shown.data as { events: Array<{ action: string; details: Record<string, unknown> }> }).events;
    expect(listed.find((e) => e.action === "load override set")?.details).toMatchObject({
      newMassKg: 2200,
      reason: REASON,
    });
    expect(listed.some((e) => e.action === "load override removed")).toBe(true);
    expect(JSON.parse(gone!.details!)).toMatchObject({
      oldMassKg: 2200,
      newMassKg: 2000,
      oldReason: REASON,
      reason: null,
    });
  });

  it("migration 0024 turns a CoG the editor moved without a reason into an override saying so, and back", async () => {
    const { planner, plan } = await readyPlan();
    const row = (await PlanRevision.findOne({ where: { planId: plan.id } }))!;
    const moved = { ...JSON.parse(row.loadSnapshot), cog: { x: 0.3, y: 0, z: 0.5 } };
    await row.update({ loadSnapshot: JSON.stringify(moved) });
    await migration.up({ context: sequelize.getQueryInterface() });
    const after = (await getPlan(planner.organisationId, plan.id))!.revision;
    expect(after.componentSnapshot.cog).toEqual({ x: 0, y: 0, z: 0.5 });
    expect(after.snapshot.cog).toEqual({ x: 0.3, y: 0, z: 0.5 });
    expect(after.loadOverride?.reason).toMatch(/before an override needed a reason/);
    await migration.down({ context: sequelize.getQueryInterface() });
    const back = JSON.parse((await PlanRevision.findByPk(row.id))!.loadSnapshot) as Record<string, unknown>;
    expect(back.cog).toEqual({ x: 0.3, y: 0, z: 0.5 });
    expect(back.override).toBeUndefined();
  });
});
