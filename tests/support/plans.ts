// Helpers for the plan tests: a job, a component and a plan made through the routes' own queries.
import { rectangleOutlines, type ComponentDefinition } from "~/loads/component-definition";
import { createComponent } from "~/models/component.server";
import { GearItem } from "~/models/gear-item.server";
import { createJob } from "~/models/job.server";
import { getPlan } from "~/models/plan.server";
import type { RiggingAllocation } from "~/plans/document";
import { createPlanFromComponent, savePlanRevision } from "~/plans/revisions.server";
import { createSite } from "~/models/site.server";
import type { SessionUser } from "~/models/user.server";
import type { GearKind } from "~/gear/kinds";
import { sessionCookie } from "./factories";
import { BLANK_GEAR_FIELDS } from "./gear";

/** A 2000 kg element with two M20 lift points 800 mm either side of its CoG, 400 mm above it. */
export function twoPointElement(overrides: Partial<ComponentDefinition> = {}): ComponentDefinition {
  return {
    name: "Test element",
    description: "",
    massKg: 2000,
    massSource: "certified",
    massNote: "",
    contingencyPct: 3,
    lengthM: 1.8,
    widthM: 0.8,
    heightM: 0.9,
    cog: { x: 0, y: 0, z: 0.5 },
    cogSource: "manufacturer",
    cogNote: "",
    ...rectangleOutlines(1.8, 0.8, 0.9),
    liftPoints: [
      { label: "A", position: { x: -0.8, y: 0, z: 0.9 }, axis: { x: 0, y: 0, z: 1 }, thread: "M20", engagementMm: 30 },
      { label: "B", position: { x: 0.8, y: 0, z: 0.9 }, axis: { x: 0, y: 0, z: 1 }, thread: "M20", engagementMm: 30 },
    ],
    parts: [],
    ...overrides,
  };
}

export async function makeJob(user: SessionUser) {
  const site = await createSite(
    user.organisationId,
    { name: "Test site", customer: "Test customer", address: "", siteContact: "", notes: "" },
    user.id,
  );
  return createJob(
    user.organisationId,
    {
      siteId: site.id,
      workOrder: `WO-${Math.random().toString(36).slice(2, 8)}`,
      title: "Test job",
      description: "",
      status: "open",
      startsOn: null,
    },
    user.id,
  );
}

/** A planner's plan of `definition` (a two-point element by default) on a new job. */
export async function makePlan(planner: SessionUser, definition: ComponentDefinition = twoPointElement()) {
  const job = await makeJob(planner);
  const component = await createComponent(planner.organisationId, definition, planner.id);
  const created = await createPlanFromComponent(
    planner.organisationId,
    job.id,
    component.id,
    "Lift the element out",
    planner.id,
  );
  if (!created.ok) throw new Error(created.message);
  return { job, component, plan: created.plan };
}

/** A gear item in the register, in service and in date. */
export async function makeGear(organisationId: number, kind: GearKind, fields: Partial<GearItem> & { wllKg: number }) {
  return GearItem.create({
    organisationId,
    itemCode: `${kind.slice(0, 2).toUpperCase()}-${Math.random().toString(36).slice(2, 7)}`,
    kind,
    wllValue: fields.wllKg,
    wllUnit: "kg",
    ...BLANK_GEAR_FIELDS,
    nextDueOn: "2099-01-01",
    // Every item carries its own mass, so the crane's gross load is complete and passes without a warning.
    massKg: 5,
    ...fields,
  });
}

/** A JSON request (PUT by default), signed in as `user` when given; `body` is sent as is when a string. */
export async function jsonRequest(pathname: string, body: unknown, user?: Pick<SessionUser, "id">, method = "PUT") {
  return new Request(`http://localhost:3000${pathname}`, {
    method,
    body: typeof body === "string" ? body : JSON.stringify(body),
    headers: { "Content-Type": "application/json", ...(user ? { Cookie: await sessionCookie(user) } : {}) },
  });
}

/** Saves the plan's current draft with `rigging` allocated, keeping its title, arrangement and details. */
export async function saveRigging(
  planner: Pick<SessionUser, "id" | "organisationId">,
  plan: { id: number; title: string },
  rigging: RiggingAllocation,
) {
  const found = (await getPlan(planner.organisationId, plan.id))!;
  return savePlanRevision(
    planner.organisationId,
    plan.id,
    found.revision.version,
    { title: plan.title, arrangement: found.revision.arrangement, rigging, details: found.revision.details },
    planner.id,
  );
}
