// The organisation's rule set reaching every check, and each allocated item's own mass reaching the crane check.
import { describe, expect, it } from "vitest";
import * as adminSettings from "~/routes/admin.settings";
import * as solve from "~/routes/api.solve";
import { recordExamination } from "~/gear/examinations.server";
import { GearItem } from "~/models/gear-item.server";
import { getOrganisation, updateOrganisationSettings } from "~/models/organisation.server";
import { getPlan } from "~/models/plan.server";
import { savePlanRevision } from "~/plans/revisions.server";
import type { SessionUser } from "~/models/user.server";
import { ruleText } from "~/plans/check-text";
import type { CheckResult } from "~/statics/checks";
import { callRoute, getRequest, makeUser, postForm } from "../support/factories";
import { jsonRequest, makeGear, makePlan, saveRigging, twoPointElement } from "../support/plans";

async function setRuleSet(user: SessionUser, ruleSet: "uk-eu" | "us") {
  const org = (await getOrganisation(user.organisationId))!;
  await updateOrganisationSettings(user.organisationId, { name: org.name, allowSelfApproval: false, ruleSet });
}

/** A plan of the two-point element with a round sling choked round each lift point (no eyebolt or shackle). */
async function chokedPlan(planner: SessionUser) {
  const { plan } = await makePlan(planner);
  const org = planner.organisationId;
  const slingA = await makeGear(org, "round_sling", { wllKg: 2000, legs: 1, lengthM: 2 });
  const slingB = await makeGear(org, "round_sling", { wllKg: 2000, legs: 1, lengthM: 2 });
  const saved = await saveRigging(planner, plan, {
    legs: { A: { slingItemId: slingA.id, hitch: "choke" }, B: { slingItemId: slingB.id, hitch: "choke" } },
  });
  if (saved.status !== "saved") throw new Error(JSON.stringify(saved));
  const results = (await getPlan(org, plan.id))!.revision.results;
  if (results.status !== 200) throw new Error(results.body.error);
  return results.body;
}

describe("the organisation's rule set", () => {
  it("an admin chooses US rules on the settings page; an unknown set is refused and changes nothing", async () => {
    const admin = await makeUser(["admin"]);
    const org = (await getOrganisation(admin.organisationId))!;
    expect(org.ruleSet).toBe("uk-eu");
    const bad = await callRoute(
      adminSettings.action,
      await postForm("/admin/settings", { name: org.name, ruleSet: "mars" }, admin),
    );
    expect(bad.status).toBe(400);
    expect((await getOrganisation(admin.organisationId))!.ruleSet).toBe("uk-eu");
    const ok = await callRoute(
      adminSettings.action,
      await postForm("/admin/settings", { name: org.name, ruleSet: "us" }, admin),
    );
    expect(ok.status).toBe(302);
    expect((await getOrganisation(admin.organisationId))!.ruleSet).toBe("us");
    const page = await callRoute(adminSettings.loader, await getRequest("/admin/settings", admin));
    expect(page.data).toMatchObject({ ruleSet: "us" });
  });

  it("a plan's choke hitch is rated 0.8 under UK / EU rules (EN 818-4) and 0.75 under US rules (US Navy rigging manual; ASME B30.9)", async () => {
    const euPlanner = await makeUser(["planner"]);
    const eu = await chokedPlan(euPlanner);
    expect(eu.ruleSet).toBe("uk-eu");
    const euLeg = eu.checks!.find((c) => c.id === "sling-leg-A")!;
    expect(euLeg.capacityKg).toBeCloseTo(1600, 9);
    expect(euLeg.ruleSet).toBe("uk-eu");

    const usPlanner = await makeUser(["planner"]);
    await setRuleSet(usPlanner, "us");
    const us = await chokedPlan(usPlanner);
    expect(us.ruleSet).toBe("us");
    const usLeg = us.checks!.find((c) => c.id === "sling-leg-A")!;
    expect(usLeg.capacityKg).toBeCloseTo(1500, 9);
    expect(usLeg.source).toMatch(/NAVEDTRA/);
    expect(us.checks!.every((c) => c.ruleSet === "us")).toBe(true);
  });

  it("/api/solve works to the organisation's rules unless the body names a set", async () => {
    const planner = await makeUser(["planner"]);
    await setRuleSet(planner, "us");
    const body = {
      load: { massKg: 1000, cog: { x: 0, y: 0, z: -0.3 } },
      liftPoints: [
        { id: "A", x: -0.5, y: 0, z: 0 },
        { id: "B", x: 0.5, y: 0, z: 0 },
      ],
      hook: { z: 1 },
      rigging: { legs: { A: { sling: { kind: "web", wllKg: 1000, hitch: "choke" } } } },
    };
    const asOrg = await callRoute(solve.action, await jsonRequest("/api/solve", body, planner, "POST"));
    const named = await callRoute(
      solve.action,
      await jsonRequest("/api/solve", { ...body, ruleSet: "uk-eu" }, planner, "POST"),
    );
    const leg = (res: { data: unknown }) =>
      (res.data as { checks: CheckResult[] }).checks.find((c) => c.id === "sling-leg-A")!;
    expect((asOrg.data as { ruleSet: string }).ruleSet).toBe("us");
    expect(leg(asOrg).capacityKg).toBeCloseTo(750, 9);
    expect(leg(named).capacityKg).toBeCloseTo(800, 9);
  });

  it("a bare solve with legs 70 deg from vertical fails its angle checks and warns (OSHA sling guidance; EN 818-6 practice)", async () => {
    const planner = await makeUser(["planner"]);
    const body = {
      load: { massKg: 1000, cog: { x: 0, y: 0, z: -0.3 } },
      liftPoints: [
        { id: "A", x: -1, y: 0, z: 0 },
        { id: "B", x: 1, y: 0, z: 0 },
      ],
      hook: { z: Math.tan((20 * Math.PI) / 180) },
    };
    const res = await callRoute(solve.action, await jsonRequest("/api/solve", body, planner, "POST"));
    expect(res.status).toBe(200);
    const data = res.data as { checks: CheckResult[]; warnings: Array<{ code: string; message: string }> };
    expect(data.checks.map((c) => [c.id, c.status])).toEqual([
      ["angle-A", "fail"],
      ["angle-B", "fail"],
    ]);
    expect(data.warnings.filter((w) => w.code === "LEG_ANGLE_OVER_MAX")).toHaveLength(2);
    expect(data.checks[0]!.message).toMatch(/70\.0° from vertical/);
  });

  it("the default next examination follows the rule set: 6 months for an accessory under LOLER, 12 under US rules", async () => {
    const eu = await makeUser(["admin"]);
    const us = await makeUser(["admin"]);
    await setRuleSet(us, "us");
    const fields = {
      kind: "periodic" as const,
      examinedOn: "2025-01-15",
      reportNumber: "",
      examiner: "A. Examiner",
      examinerOrganisation: "",
      result: "pass" as const,
      defects: "",
      defectUrgency: "none" as const,
      defectsDueBy: null,
      schemeReference: "",
      nextDueOn: null,
    };
    const euItem = await makeGear(eu.organisationId, "shackle", { wllKg: 2000, shackleType: "bow", pinType: "screw" });
    const usItem = await makeGear(us.organisationId, "shackle", { wllKg: 2000, shackleType: "bow", pinType: "screw" });
    expect(await recordExamination(eu.organisationId, euItem.id, fields, null, eu.id)).toMatchObject({
      ok: true,
      nextDueOn: "2025-07-15",
    });
    expect(await recordExamination(us.organisationId, usItem.id, fields, null, us.id)).toMatchObject({
      ok: true,
      nextDueOn: "2026-01-15",
    });
  });
});

describe("gear masses in the crane check (ASME P30.1 ch. 5: gross load including rigging)", () => {
  it("gross load = 2000 kg x 1.03 + every allocated item's own mass, and the rule lists what it added", async () => {
    const planner = await makeUser(["planner"]);
    const org = planner.organisationId;
    const base = twoPointElement();
    const { plan } = await makePlan(
      planner,
      twoPointElement({ liftPoints: base.liftPoints.map((p) => ({ ...p, thread: "M30" })) }),
    );
    const eyeA = await makeGear(org, "eyebolt", { wllKg: 3200, thread: "M30", eyeboltFamily: "collar", massKg: 2.1 });
    const eyeB = await makeGear(org, "eyebolt", { wllKg: 3200, thread: "M30", eyeboltFamily: "collar", massKg: 2.1 });
    const sling = await makeGear(org, "chain_sling", {
      wllKg: 4250,
      chainGrade: 8,
      diameterMm: 10,
      legs: 2,
      lengthM: 1.8,
      massKg: 11.6,
    });
    const link = await makeGear(org, "master_link", { wllKg: 6700, massKg: 2.7 });
    const crane = await makeGear(org, "crane", { wllKg: 5000, hookHeightM: 6 });
    const saved = await saveRigging(planner, plan, {
      legs: {
        A: { eyeboltItemId: eyeA.id, slingItemId: sling.id, hitch: "straight" },
        B: { eyeboltItemId: eyeB.id, slingItemId: sling.id, hitch: "straight" },
      },
      masterLinkItemId: link.id,
      craneItemId: crane.id,
    });
    expect(saved.status).toBe("saved");
    const results = (await getPlan(org, plan.id))!.revision.results;
    if (results.status !== 200) throw new Error(results.body.error);
    const check = results.body.checks!.find((c) => c.id === "crane-load")!;
    // The two-leg sling is one item: its mass counts once.
    expect(check.loadKg).toBeCloseTo(2000 * 1.03 + 2.1 + 2.1 + 11.6 + 2.7, 9);
    expect(check.status).toBe("pass");
    const rule = ruleText(check, "metric");
    for (const item of [eyeA, eyeB, sling, link]) expect(rule).toContain(item.itemCode);
    expect(results.body.checks!.find((c) => c.id === "master-link")!.loadKg).toBeCloseTo(2000 * 1.03 + 15.8, 9);

    await GearItem.update({ massKg: null }, { where: { id: link.id } });
    const again = (await getPlan(org, plan.id))!;
    const resaved = await savePlanRevision(
      org,
      plan.id,
      again.revision.version,
      {
        title: plan.title,
        arrangement: again.revision.arrangement,
        rigging: again.revision.rigging,
        details: again.revision.details,
      },
      planner.id,
    );
    expect(resaved.status).toBe("saved");
    const after = (await getPlan(org, plan.id))!.revision.results;
    if (after.status !== 200) throw new Error(after.body.error);
    const warned = after.body.checks!.find((c) => c.id === "crane-load")!;
    expect(warned.status).toBe("warn");
    expect(warned.message).toContain(link.itemCode);
  });
});
