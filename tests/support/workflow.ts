// A plan ready for review: a 2000 kg two-point element with M30 collar eyebolts (DIN 580 M30:
// 2300 kg per eyebolt up to 45 deg), 10 mm grade 8 chain legs (EN 818-4: 3.15 t single leg), a
// master link and a 10 t crane allocated (a complete load path), every check passing with the legs
// 30 deg from vertical.
import { PlanRevision } from "~/models/plan.server";
import { formAsPlanned } from "~/plans/lift-record";
import { readSealed } from "~/plans/sealed";
import { getOrganisation, updateOrganisationSettings } from "~/models/organisation.server";
import type { SessionUser } from "~/models/user.server";
import { makeUser } from "./factories";
import { makeGear, makePlan, saveRigging, twoPointElement } from "./plans";

export async function readyPlan(options: { overdueEyebolt?: boolean } = {}) {
  const planner = await makeUser(["planner"], { name: "Pat Planner" });
  const approver = await makeUser(["approver"], { organisationId: planner.organisationId, name: "Avery Approver" });
  const rigger = await makeUser(["rigger"], { organisationId: planner.organisationId, name: "Robin Rigger" });
  const base = twoPointElement();
  const { plan } = await makePlan(
    planner,
    twoPointElement({ liftPoints: base.liftPoints.map((p) => ({ ...p, thread: "M30" })) }),
  );
  const org = planner.organisationId;
  const eyeboltA = await makeGear(org, "eyebolt", {
    wllKg: 3200,
    thread: "M30",
    eyeboltFamily: "collar",
    ...(options.overdueEyebolt ? { nextDueOn: "2000-01-01" } : {}),
  });
  const eyeboltB = await makeGear(org, "eyebolt", { wllKg: 3200, thread: "M30", eyeboltFamily: "collar" });
  const slingA = await makeGear(org, "chain_sling", {
    wllKg: 3150,
    chainGrade: 8,
    diameterMm: 10,
    legs: 1,
    lengthM: 1.8,
  });
  const slingB = await makeGear(org, "chain_sling", {
    wllKg: 3150,
    chainGrade: 8,
    diameterMm: 10,
    legs: 1,
    lengthM: 1.8,
  });
  const masterLink = await makeGear(org, "master_link", { wllKg: 6700 });
  const crane = await makeGear(org, "crane", { wllKg: 10000 });
  const saved = await saveRigging(planner, plan, {
    legs: {
      A: { eyeboltItemId: eyeboltA.id, slingItemId: slingA.id, hitch: "straight" },
      B: { eyeboltItemId: eyeboltB.id, slingItemId: slingB.id, hitch: "straight" },
    },
    masterLinkItemId: masterLink.id,
    craneItemId: crane.id,
  });
  if (saved.status !== "saved") throw new Error(`could not prepare the plan: ${JSON.stringify(saved)}`);
  return { planner, approver, rigger, plan, gear: { eyeboltA, eyeboltB, slingA, slingB, masterLink, crane } };
}

export async function allowSelfApproval(user: SessionUser) {
  const org = (await getOrganisation(user.organisationId))!;
  await updateOrganisationSettings(user.organisationId, { name: org.name, allowSelfApproval: true });
}

/** The lift record form of a lift made to the plan's approved revision exactly as planned. */
export async function liftAsPlanned(planId: number, releasedBy = "Dee Marchetti") {
  const approved = await PlanRevision.findOne({ where: { planId, status: "approved" } });
  const sealed = readSealed(approved?.sealed);
  if (!sealed) throw new Error("the plan has no sealed approved revision");
  return formAsPlanned(sealed, releasedBy, new Date(Date.now() - 10 * 60_000));
}
