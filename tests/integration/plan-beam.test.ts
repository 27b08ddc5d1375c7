// A lifting beam allocated from the register: its own mass joins the crane's gross load, its marked WLL
// rates the beam check, its lugs place the drops, and it goes through the lifecycle like any item.
import { describe, expect, it } from "vitest";
import { GearItem } from "~/models/gear-item.server";
import { getPlan, PlanRevision } from "~/models/plan.server";
import type { Arrangement, RiggingAllocation } from "~/plans/document";
import { liveStateOf } from "~/plans/live-state.server";
import { savePlanRevision } from "~/plans/revisions.server";
import { readSealed } from "~/plans/sealed";
import { approveRevision, submitRevision } from "~/plans/workflow.server";
import { makeUser, TEST_PASSWORD } from "../support/factories";
import { makeGear, makePlan, twoPointElement } from "../support/plans";

// The two-point element (2000 kg, 3 % contingency, lift points A and B at x = -0.8 and 0.8 m, z = 0.9 m)
// with its CoG at x = -0.4 m: 400 mm from A, 1200 mm from B, so A carries 3/4 by the lever rule
// (V_A = W b / (a + b), CHECK-VALUES.md "Two legs, CoG offset").
const base = twoPointElement();
const element = twoPointElement({
  cog: { x: -0.4, y: 0, z: 0.5 },
  liftPoints: base.liftPoints.map((p) => ({ ...p, thread: "M30" })),
});
// A 2 m beam, 120 kg, drop lugs 1.6 m apart (0.2 and 1.8 m from end A, as A and B). Placed over the
// points its mid-length is at x = 0, so beam and load balance at x = (2000 x -0.4 + 120 x 0) / 2120 m,
// 0.62264 m from end A: the top lug is there.
const beamFields = {
  wllKg: 2500,
  lengthM: 2,
  beamMassKg: 120,
  dropLugsM: "0.2, 1.8",
  topLugsM: "0.62264",
  massKg: null,
};

async function setup(beamOverrides: Partial<GearItem> = {}) {
  const planner = await makeUser(["planner"], { name: "Pat Planner" });
  const approver = await makeUser(["approver"], { organisationId: planner.organisationId, name: "Avery Approver" });
  const org = planner.organisationId;
  const { plan } = await makePlan(planner, element);
  const beam = await makeGear(org, "beam", { ...beamFields, ...beamOverrides });
  const slingA = await makeGear(org, "chain_sling", {
    wllKg: 3150,
    chainGrade: 8,
    diameterMm: 10,
    legs: 1,
    lengthM: 1,
  });
  const slingB = await makeGear(org, "chain_sling", {
    wllKg: 3150,
    chainGrade: 8,
    diameterMm: 10,
    legs: 1,
    lengthM: 1,
  });
  // M30 collar eyebolts (DIN 580 M30: 3.2 t axial), as in tests/support/workflow.ts.
  const eyebolt = { wllKg: 3200, thread: "M30", eyeboltFamily: "collar" };
  const eyeboltA = await makeGear(org, "eyebolt", eyebolt);
  const eyeboltB = await makeGear(org, "eyebolt", eyebolt);
  const crane = await makeGear(org, "crane", { wllKg: 2500, hookHeightM: 6 });
  return { planner, approver, org, plan, beam, slingA, slingB, eyeboltA, eyeboltB, crane };
}

const arrangement: Arrangement = {
  kind: "beam",
  mode: "level",
  hookHeightM: 2.5,
  legLengthsM: {},
  liftPointLabels: ["A", "B"],
  beam: { dropLengthM: 0.8 },
};

async function save(s: Awaited<ReturnType<typeof setup>>, rigging: RiggingAllocation, a: Arrangement = arrangement) {
  const found = (await getPlan(s.org, s.plan.id))!;
  return savePlanRevision(
    s.org,
    s.plan.id,
    found.revision.version,
    { title: s.plan.title, arrangement: a, rigging, details: found.revision.details },
    s.planner.id,
  );
}

const rigging = (s: Awaited<ReturnType<typeof setup>>): RiggingAllocation => ({
  legs: {
    A: { eyeboltItemId: s.eyeboltA.id, slingItemId: s.slingA.id, hitch: "straight" },
    B: { eyeboltItemId: s.eyeboltB.id, slingItemId: s.slingB.id, hitch: "straight" },
  },
  hookTakesLegs: true,
  craneItemId: s.crane.id,
  beamItemId: s.beam.id,
});

describe("a lifting beam from the register", () => {
  it("puts its mass in the crane's gross load and its WLL in the beam check, and its lugs above the lift points", async () => {
    const s = await setup();
    const saved = await save(s, rigging(s));
    expect(saved.status).toBe("saved");
    const results = (await getPlan(s.org, s.plan.id))!.revision.results;
    expect(results.status).toBe(200);
    if (results.status !== 200) return;
    const body = results.body;
    // Drops by the lever rule: A 1500 kg, B 500 kg.
    const byId = Object.fromEntries(body.legs.map((l) => [l.liftPointId, l]));
    expect(byId.A!.tensionKg).toBeCloseTo(1500, 6);
    expect(byId.B!.tensionKg).toBeCloseTo(500, 6);
    expect(byId.A!.angleFromVerticalDeg).toBeLessThan(1e-6);
    const checks = body.checks ?? [];
    // Beam: 2000 kg x 1.03 = 2060 kg on the register's 2500 kg WLL.
    const beamCheck = checks.find((c) => c.id === "beam")!;
    expect(beamCheck).toMatchObject({ itemCode: s.beam.itemCode, capacityKg: 2500, status: "pass" });
    expect(beamCheck.loadKg).toBeCloseTo(2060, 9);
    // Crane (LOLER reg 8 gross load): 2060 kg + the beam's 120 kg + two slings and two eyebolts of 5 kg each
    // = 2200 kg on 2500 kg.
    const craneCheck = checks.find((c) => c.id === "crane-load")!;
    expect(craneCheck.loadKg).toBeCloseTo(2200, 9);
    expect(craneCheck.utilisation).toBeCloseTo(2200 / 2500, 12);
    expect(craneCheck.inputs?.gross?.beamMassKg).toBe(120);
    expect(craneCheck.status).toBe("pass");
    expect(body.beam).toMatchObject({ itemCode: s.beam.itemCode, massKg: 120, wllKg: 2500, hookMassKg: 2120 });
    const placement = body.beam!.placement!;
    expect(placement.endA.x).toBeCloseTo(-1, 9);
    expect(placement.endB.x).toBeCloseTo(1, 9);
    expect(placement.drops.map((d) => d.lug.x)).toEqual([expect.closeTo(-0.8, 9), expect.closeTo(0.8, 9)]);
    expect(placement.beamZM).toBeCloseTo(1.7, 9);
  });

  it("a heavier beam on the same crane overloads it: the crane check fails with the beam's mass in it", async () => {
    // 500 kg of beam at x = 0 with the load at x = -0.4 m balance at x = -0.4 x 2000 / 2500 = -0.32 m: 0.68 m from end A.
    const s = await setup({ beamMassKg: 500, topLugsM: "0.68" });
    expect((await save(s, rigging(s))).status).toBe("saved");
    const results = (await getPlan(s.org, s.plan.id))!.revision.results;
    if (results.status !== 200) throw new Error(JSON.stringify(results.body));
    const crane = (results.body.checks ?? []).find((c) => c.id === "crane-load")!;
    expect(crane.loadKg).toBeCloseTo(2060 + 500 + 20, 9);
    expect(crane.status).toBe("fail");
  });

  it("goes into the sealed record and the live re-check like every allocated item", async () => {
    const s = await setup();
    expect((await save(s, rigging(s))).status).toBe("saved");
    const submitted = await submitRevision(s.org, s.plan.id, s.planner, {});
    expect(submitted).toMatchObject({ ok: true });
    const approved = await approveRevision(s.org, s.plan.id, s.approver, {
      password: TEST_PASSWORD,
      typedName: s.approver.name,
      comment: "Go.",
    });
    expect(approved).toMatchObject({ ok: true });
    const row = (await PlanRevision.findOne({ where: { planId: s.plan.id, revision: 1 } }))!;
    const sealed = readSealed(row.sealed)!;
    const entry = sealed.schedule.find((i) => i.slot === "beam")!;
    expect(entry).toMatchObject({ itemCode: s.beam.itemCode, massKg: 120, wllKg: 2500, utilisation: 2060 / 2500 });
    await s.beam.update({ status: "quarantined", statusReason: "Lug cracked" });
    const live = await liveStateOf(s.org, sealed);
    expect(live.problems.map((p) => [p.itemCode, p.kind])).toContainEqual([s.beam.itemCode, "quarantined"]);
  });

  it("a withdrawn beam is refused on allocation and nothing is written", async () => {
    const s = await setup({ status: "withdrawn", statusReason: "Bent" });
    const before = (await getPlan(s.org, s.plan.id))!.revision.version;
    const saved = await save(s, rigging(s));
    expect(saved).toMatchObject({ status: "invalid" });
    expect(JSON.stringify(saved)).toContain(`${s.beam.itemCode} is withdrawn from use (Bent)`);
    expect((await getPlan(s.org, s.plan.id))!.revision.version).toBe(before);
  });

  it("a quarantined beam fails its inspection check, so the plan cannot be submitted", async () => {
    const s = await setup({ status: "quarantined", statusReason: "Lug cracked" });
    expect((await save(s, rigging(s))).status).toBe("saved");
    const results = (await getPlan(s.org, s.plan.id))!.revision.results;
    if (results.status !== 200) throw new Error(JSON.stringify(results.body));
    expect((results.body.checks ?? []).find((c) => c.id === `inspection-${s.beam.itemCode}`)?.status).toBe("fail");
    const submitted = await submitRevision(s.org, s.plan.id, s.planner, {});
    expect(submitted).toMatchObject({ ok: false });
  });

  it("refuses a beam item without lugs, a beam on a bridle and an item that is not a beam, saying why", async () => {
    const s = await setup();
    const bare = await makeGear(s.org, "beam", { wllKg: 2500, lengthM: 2, beamMassKg: 120 });
    expect(JSON.stringify(await save(s, { ...rigging(s), beamItemId: bare.id }))).toContain("has no lug positions");
    expect(JSON.stringify(await save(s, { ...rigging(s), beamItemId: s.crane.id, craneItemId: undefined }))).toContain(
      "not a lifting beam or spreader",
    );
    const bridle: Arrangement = { ...arrangement, kind: "bridle", beam: undefined };
    expect(JSON.stringify(await save(s, rigging(s), bridle))).toContain(
      "A beam is allocated but the legs go to one hook",
    );
  });

  it("a plan with the beam's figures typed in (made before) still works out, its check marked not from the register", async () => {
    const s = await setup();
    const typed: Arrangement = { ...arrangement, beam: { massKg: 120, wllKg: 2500, lengthM: 2, dropLengthM: 0.8 } };
    expect((await save(s, { ...rigging(s), beamItemId: undefined }, typed)).status).toBe("saved");
    const results = (await getPlan(s.org, s.plan.id))!.revision.results;
    if (results.status !== 200) throw new Error(JSON.stringify(results.body));
    const beamCheck = (results.body.checks ?? []).find((c) => c.id === "beam")!;
    expect(beamCheck.item).toContain("not from the register");
    expect(beamCheck.itemCode).toBeNull();
  });
});
