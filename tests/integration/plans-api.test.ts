import { describe, expect, it } from "vitest";
import * as planApi from "~/routes/api.plans.$planId";
import * as planList from "~/routes/api.plans";
import { AuditEvent } from "~/models/audit-event.server";
import { updateComponent } from "~/models/component.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { PlanRevision } from "~/models/plan.server";
import { handleSolve } from "~/statics/api";
import { callRoute, getRequest, makeUser } from "../support/factories";
import { jsonRequest, makeGear, makePlan, twoPointElement } from "../support/plans";

type PlanBody = {
  id: number;
  version: number;
  status: string;
  title: string;
  arrangement: Record<string, unknown>;
  rigging: Record<string, unknown>;
  details: Record<string, unknown>;
  snapshot: { massKg: number };
  componentVersion: number;
  latestComponentVersion: number;
  results: {
    status: number;
    kind: string;
    body: {
      legs: Array<{ liftPointId: string; tensionKg: number; angleFromVerticalDeg: number }>;
      checks?: Array<{ id: string; status: string }>;
      error?: string;
    };
  };
};

async function getPlanBody(planId: number, user: { id: number }) {
  const res = await callRoute(planApi.loader, await getRequest(`/api/plans/${planId}`, user), {
    planId: String(planId),
  });
  expect(res.status).toBe(200);
  return res.data as PlanBody;
}

function documentOf(body: PlanBody) {
  return {
    version: body.version,
    title: body.title,
    arrangement: body.arrangement,
    rigging: body.rigging,
    details: body.details,
  };
}

async function put(planId: number, payload: unknown, user: { id: number }) {
  return callRoute(planApi.action, await jsonRequest(`/api/plans/${planId}`, payload, user), {
    planId: String(planId),
  });
}

async function revisionRow(planId: number) {
  return (await PlanRevision.findOne({ where: { planId } }))!;
}

describe("plans API", () => {
  it("a new plan copies the component, starts level with legs near 30 deg, and keeps its copy when the component changes", async () => {
    const planner = await makeUser(["planner"]);
    const { plan, component } = await makePlan(planner);
    const body = await getPlanBody(plan.id, planner);
    expect(body).toMatchObject({
      status: "draft",
      version: 1,
      componentVersion: 1,
      latestComponentVersion: 1,
      arrangement: { kind: "bridle", mode: "level", liftPointLabels: ["A", "B"] },
    });
    expect(body.results.status).toBe(200);
    // Hook 800 / tan 30 deg above the lift points: each leg 30 deg from vertical, inside the 45 deg warning.
    for (const leg of body.results.body.legs) expect(leg.angleFromVerticalDeg).toBeCloseTo(30, 1);
    const sequence = body.details.sequence as Array<{ title: string; holdPoint: boolean }>;
    expect(sequence.find((s) => /trial lift/i.test(s.title))?.holdPoint).toBe(true);

    await updateComponent(planner.organisationId, component.id, twoPointElement({ massKg: 2400 }), 1, planner.id);
    const after = await getPlanBody(plan.id, planner);
    expect(after.snapshot.massKg).toBe(2000);
    expect(after.componentVersion).toBe(1);
    expect(after.latestComponentVersion).toBe(2);
  });

  it("a PUT stores results computed on the server, equal to /api/solve's for the same geometry, whatever figures the client sends", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    const eyeboltA = await makeGear(planner.organisationId, "eyebolt", {
      wllKg: 3200,
      thread: "M20",
      eyeboltFamily: "collar",
    });
    const eyeboltB = await makeGear(planner.organisationId, "eyebolt", {
      wllKg: 3200,
      thread: "M20",
      eyeboltFamily: "collar",
    });
    const body = await getPlanBody(plan.id, planner);
    const payload = {
      ...documentOf(body),
      title: "Lift the element onto the skid",
      arrangement: { ...body.arrangement, hookHeightM: 1.7 },
      rigging: {
        legs: {
          A: { eyeboltItemId: eyeboltA.id, hitch: "straight" },
          B: { eyeboltItemId: eyeboltB.id, hitch: "straight" },
        },
      },
      results: { status: 200, body: { legs: [{ liftPointId: "A", tensionKg: 1 }] } },
    };
    const res = await put(plan.id, payload, planner);
    expect(res.status).toBe(200);
    const saved = res.data as PlanBody;
    expect(saved.version).toBe(2);
    expect(saved.title).toBe("Lift the element onto the skid");
    // Symmetric two legs at 45 deg from vertical: T = W / (2 cos 45) = 1414.2 kg each (statics of a symmetric bridle, common practice).
    for (const leg of saved.results.body.legs) expect(leg.tensionKg).toBeCloseTo(1414.2, 1);
    const expected = handleSolve(
      {
        load: { massKg: 2000, cog: { x: 0, y: 0, z: 0.5 } },
        liftPoints: [
          { id: "A", x: -0.8, y: 0, z: 0.9, thread: "M20" },
          { id: "B", x: 0.8, y: 0, z: 0.9, thread: "M20" },
        ],
        hook: { z: 1.7 },
      },
      await getReferenceTables(),
    );
    expect(expected.status).toBe(200);
    if (expected.status !== 200) return;
    expect(saved.results.body.legs).toEqual(expected.body.legs);
    expect(saved.results.body.checks?.map((c) => c.id)).toEqual(
      expect.arrayContaining(["eyebolt-A", "eyebolt-B", `inspection-${eyeboltA.itemCode}`]),
    );
    const stored = JSON.parse((await revisionRow(plan.id)).results) as PlanBody["results"];
    expect(stored.body.legs).toEqual(expected.body.legs);
  });

  it("a stale version gets 409 and the newer save stands", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    const body = await getPlanBody(plan.id, planner);
    expect((await put(plan.id, { ...documentOf(body), title: "First" }, planner)).status).toBe(200);
    const stale = await put(plan.id, { ...documentOf(body), title: "Second" }, planner);
    expect(stale.status).toBe(409);
    expect(stale.data).toMatchObject({ code: "stale" });
    expect((stale.data as { error: string }).error).toMatch(/Someone else saved this plan/);
    expect((await getPlanBody(plan.id, planner)).title).toBe("First");
  });

  it("a revision that is no longer a draft is frozen: 409 and nothing changes", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    const body = await getPlanBody(plan.id, planner);
    await PlanRevision.update({ status: "approved" }, { where: { planId: plan.id } });
    const res = await put(plan.id, { ...documentOf(body), title: "Changed after approval" }, planner);
    expect(res.status).toBe(409);
    expect(res.data).toMatchObject({ code: "frozen" });
    const row = await revisionRow(plan.id);
    expect(row.version).toBe(1);
    expect((await getPlanBody(plan.id, planner)).title).toBe("Lift the element out");
  });

  it("riggers read plans but cannot save them", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    const rigger = await makeUser(["rigger"], { organisationId: planner.organisationId });
    const body = await getPlanBody(plan.id, rigger);
    const res = await put(plan.id, { ...documentOf(body), title: "Rigger's change" }, rigger);
    expect(res.status).toBe(403);
    expect((await revisionRow(plan.id)).version).toBe(1);
  });

  it("another organisation's plan is not found, for reading or saving", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    const body = await getPlanBody(plan.id, planner);
    const stranger = await makeUser(["planner"]);
    expect(
      (
        await callRoute(planApi.loader, await getRequest(`/api/plans/${plan.id}`, stranger), {
          planId: String(plan.id),
        })
      ).status,
    ).toBe(404);
    expect((await put(plan.id, { ...documentOf(body), title: "Hijack" }, stranger)).status).toBe(404);
    expect((await getPlanBody(plan.id, planner)).title).toBe("Lift the element out");
    const list = await callRoute(planList.loader, await getRequest("/api/plans", stranger));
    expect(list.data).toEqual({ plans: [], next: null });
  });

  it("anonymous requests get 401 JSON", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    expect(
      (await callRoute(planApi.loader, await getRequest(`/api/plans/${plan.id}`), { planId: String(plan.id) })).status,
    ).toBe(401);
    expect((await callRoute(planList.loader, await getRequest("/api/plans"))).status).toBe(401);
  });

  it("bad JSON and bad shapes get 400 with a clear message, and nothing is written", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    const body = await getPlanBody(plan.id, planner);
    const audits = await AuditEvent.count();
    const bad: Array<[unknown, RegExp]> = [
      ["{ not json", /not valid JSON/],
      [[1, 2], /plan is not valid/],
      [{ ...documentOf(body), version: "one" }, /version/],
      [{ ...documentOf(body), arrangement: { ...body.arrangement, hookHeightM: "high" } }, /hook height/],
      [{ ...documentOf(body), arrangement: { ...body.arrangement, liftPointLabels: ["A", "A"] } }, /listed twice/],
      [{ ...documentOf(body), arrangement: { ...body.arrangement, liftPointLabels: ["A", "Z"] } }, /no lift point Z/],
      [
        { ...documentOf(body), arrangement: { ...body.arrangement, liftPointLabels: ["A", "B", "C", "D", "E"] } },
        /at most four/,
      ],
      [{ ...documentOf(body), details: { ...body.details, floorClearanceM: -1 } }, /floor clearance/],
      [{ ...documentOf(body), details: { ...body.details, sequence: [] } }, /at least one step/],
      [
        { ...documentOf(body), rigging: { legs: { A: { slingItemId: 999999, hitch: "straight" } } } },
        /no gear item 999999/,
      ],
      [{ ...documentOf(body), title: "" }, /title/],
    ];
    for (const [payload, message] of bad) {
      const res = await put(plan.id, payload, planner);
      expect(res.status, JSON.stringify(payload).slice(0, 80)).toBe(400);
      expect((res.data as { error: string }).error).toMatch(message);
    }
    const row = await revisionRow(plan.id);
    expect(row.version).toBe(1);
    expect(await AuditEvent.count()).toBe(audits);
  });

  it("gear of another organisation or of the wrong kind cannot be allocated", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    const body = await getPlanBody(plan.id, planner);
    const stranger = await makeUser(["planner"]);
    const theirs = await makeGear(stranger.organisationId, "eyebolt", {
      wllKg: 3200,
      thread: "M20",
      eyeboltFamily: "collar",
    });
    const shackle = await makeGear(planner.organisationId, "shackle", {
      wllKg: 3250,
      shackleType: "bow",
      pinType: "screw",
    });
    const foreign = await put(
      plan.id,
      { ...documentOf(body), rigging: { legs: { A: { eyeboltItemId: theirs.id } } } },
      planner,
    );
    expect(foreign.status).toBe(400);
    const wrongKind = await put(
      plan.id,
      { ...documentOf(body), rigging: { legs: { A: { eyeboltItemId: shackle.id } } } },
      planner,
    );
    expect(wrongKind.status).toBe(400);
    expect((wrongKind.data as { error: string }).error).toMatch(/is a shackle, not an eyebolt/);
    const twice = await put(
      plan.id,
      {
        ...documentOf(body),
        rigging: { legs: { A: { shackleItemId: shackle.id }, B: { shackleItemId: shackle.id } } },
      },
      planner,
    );
    expect(twice.status).toBe(400);
    const scrapped = await makeGear(planner.organisationId, "shackle", { wllKg: 3250, status: "withdrawn" });
    const withdrawn = await put(
      plan.id,
      { ...documentOf(body), rigging: { legs: { A: { shackleItemId: scrapped.id } } } },
      planner,
    );
    expect(withdrawn.status).toBe(400);
    expect((withdrawn.data as { error: string }).error).toMatch(/withdrawn from use .* can never be allocated again/);
    expect((await revisionRow(plan.id)).version).toBe(1);
  });

  it("a quarantined or overdue item shows as a failing inspection check", async () => {
    const planner = await makeUser(["planner"]);
    const { plan } = await makePlan(planner);
    const body = await getPlanBody(plan.id, planner);
    const overdue = await makeGear(planner.organisationId, "eyebolt", {
      wllKg: 3200,
      thread: "M20",
      eyeboltFamily: "collar",
      nextDueOn: "2000-01-01",
    });
    const quarantined = await makeGear(planner.organisationId, "eyebolt", {
      wllKg: 3200,
      thread: "M20",
      eyeboltFamily: "collar",
      status: "quarantined",
    });
    const res = await put(
      plan.id,
      {
        ...documentOf(body),
        rigging: { legs: { A: { eyeboltItemId: overdue.id }, B: { eyeboltItemId: quarantined.id } } },
      },
      planner,
    );
    expect(res.status).toBe(200);
    const checks = (res.data as PlanBody).results.body.checks ?? [];
    expect(checks.find((c) => c.id === `inspection-${overdue.itemCode}`)?.status).toBe("fail");
    expect(checks.find((c) => c.id === `inspection-${quarantined.itemCode}`)?.status).toBe("fail");
  });

  it("a beam arrangement shares the load between vertical drops by the lever rule and checks the beam", async () => {
    const planner = await makeUser(["planner"]);
    // CoG 200 mm from A and 600 mm from B: A carries 3/4 of 2000 kg by the lever rule (statics, common practice).
    const { plan } = await makePlan(planner, twoPointElement({ cog: { x: -0.4, y: 0, z: 0.5 } }));
    const body = await getPlanBody(plan.id, planner);
    const crane = await makeGear(planner.organisationId, "crane", { wllKg: 2000, hookHeightM: 6 });
    const res = await put(
      plan.id,
      {
        ...documentOf(body),
        arrangement: {
          kind: "beam",
          mode: "level",
          hookHeightM: 2.5,
          liftPointLabels: ["A", "B"],
          beam: { massKg: 120, wllKg: 2500, lengthM: 2, dropLengthM: 0.8 },
        },
        rigging: { legs: {}, craneItemId: crane.id },
      },
      planner,
    );
    expect(res.status).toBe(200);
    const results = (res.data as PlanBody).results;
    expect(results.kind).toBe("beam");
    const byId = Object.fromEntries(results.body.legs.map((l) => [l.liftPointId, l]));
    expect(byId.A!.tensionKg).toBeCloseTo(1500, 6);
    expect(byId.B!.tensionKg).toBeCloseTo(500, 6);
    const checks = results.body.checks ?? [];
    expect(checks.find((c) => c.id === "beam")?.status).toBe("pass");
    // 2000 kg x 1.03 + 120 kg beam = 2180 kg on a 2000 kg crane.
    expect(checks.find((c) => c.id === "crane-load")?.status).toBe("fail");
  });

  it("GET /api/plans lists the organisation's plans with their current revision", async () => {
    const planner = await makeUser(["planner"]);
    const { plan, job } = await makePlan(planner);
    const second = await makePlan(planner);
    const res = await callRoute(planList.loader, await getRequest("/api/plans", planner));
    expect(res.status).toBe(200);
    expect((res.data as { plans: unknown[] }).plans).toEqual(
      expect.arrayContaining([
        { id: plan.id, title: "Lift the element out", status: "draft", revision: 1, version: 1, jobId: job.id },
        {
          id: second.plan.id,
          title: "Lift the element out",
          status: "draft",
          revision: 1,
          version: 1,
          jobId: second.job.id,
        },
      ]),
    );
    const forJob = await callRoute(planList.loader, await getRequest(`/api/plans?jobId=${job.id}`, planner));
    expect((forJob.data as { plans: Array<{ id: number }> }).plans.map((p) => p.id)).toEqual([plan.id]);
    expect((await callRoute(planList.loader, await getRequest("/api/plans?jobId=x", planner))).status).toBe(400);
  });
});
