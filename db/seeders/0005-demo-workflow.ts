import { getPlan, Plan, PlanRevision } from "~/models/plan.server";
import { formAsPlanned } from "~/plans/lift-record";
import { readSealed } from "~/plans/sealed";
import { approveRevision, assignRigger, startNewRevision, submitRevision } from "~/plans/workflow.server";
import { recordLift } from "~/plans/lift.server";
import { PRE_LIFT_CHECKLIST } from "~/plans/workflow";
import { findUserByEmail, getActiveSessionUser, type SessionUser } from "~/models/user.server";
import { DEMO_PASSWORD } from "./0001-demo-scenario";

async function demoUser(email: string): Promise<SessionUser> {
  const user = await findUserByEmail(email);
  const session = user ? await getActiveSessionUser(user.id) : null;
  if (!session) throw new Error(`demo user ${email} is missing`);
  return session;
}

function expectOk(result: { ok: boolean; message?: string }, step: string) {
  if (!result.ok) throw new Error(`demo workflow: ${step} failed: ${result.message ?? ""}`);
}

/** Acknowledges every warning of the plan's current revision with a reason a planner would give. */
async function acknowledgeAll(orgId: number, planId: number) {
  const found = (await getPlan(orgId, planId))!;
  const checks = found.revision.results.status === 200 ? (found.revision.results.body.checks ?? []) : [];
  return Object.fromEntries(
    checks
      .filter((c) => c.status === "warn")
      .map((c) => [
        c.id,
        c.id.startsWith("inspection-")
          ? "Item is examined and in date on the day of the lift; the examiner is booked for the week after."
          : "Reviewed with the site engineer: acceptable for this lift.",
      ]),
  );
}

/**
 * The demo plans in every state: the C2 element stays a draft (with a failing eyebolt to put right),
 * the gearbox cover waits in review, the gearbox has revision 1 superseded by an approved revision 2
 * assigned to the rigger, and the motor's lift is completed with its record.
 */
export async function up() {
  const planner = await demoUser("planner@example.com");
  const approver = await demoUser("approver@example.com");
  const rigger = await demoUser("rigger@example.com");
  const org = planner.organisationId;
  const plans = await Plan.findAll({ where: { organisationId: org } });
  const byTitle = (start: string) => plans.find((p) => p.title.startsWith(start));
  const cover = byTitle("Lift the B1 gearbox top cover");
  const gearbox = byTitle("Lift the B1 gearbox off");
  const motor = byTitle("Lift the P4 drive motor");
  if (!cover || !gearbox || !motor) return;
  const sign = { password: DEMO_PASSWORD, typedName: approver.name };

  expectOk(await submitRevision(org, cover.id, planner, await acknowledgeAll(org, cover.id)), "submit the cover");

  expectOk(await submitRevision(org, gearbox.id, planner, await acknowledgeAll(org, gearbox.id)), "submit the gearbox");
  expectOk(
    await approveRevision(org, gearbox.id, approver, {
      ...sign,
      comment: "Trial lift to 50 mm and check the skid is chocked.",
    }),
    "approve the gearbox",
  );
  expectOk(await startNewRevision(org, gearbox.id, planner), "start gearbox revision 2");
  expectOk(
    await submitRevision(org, gearbox.id, planner, await acknowledgeAll(org, gearbox.id)),
    "submit gearbox revision 2",
  );
  expectOk(
    await approveRevision(org, gearbox.id, approver, {
      ...sign,
      comment: "Revision 2 after the site survey: same rigging, lift path confirmed.",
    }),
    "approve gearbox revision 2",
  );
  expectOk(await assignRigger(org, gearbox.id, approver, rigger.id), "assign the gearbox lift");

  expectOk(await submitRevision(org, motor.id, planner, await acknowledgeAll(org, motor.id)), "submit the motor");
  expectOk(await approveRevision(org, motor.id, approver, { ...sign, comment: "" }), "approve the motor");
  expectOk(await assignRigger(org, motor.id, approver, rigger.id), "assign the motor lift");
  const checklist = Object.fromEntries(PRE_LIFT_CHECKLIST.map((c) => [c.id, true])) as Record<
    (typeof PRE_LIFT_CHECKLIST)[number]["id"],
    boolean
  >;
  const sealed = readSealed((await PlanRevision.findOne({ where: { planId: motor.id, status: "approved" } }))?.sealed);
  if (!sealed) throw new Error("demo workflow: the motor's approved revision is not sealed");
  const landed = Date.now() - 24 * 60 * 60 * 1000;
  expectOk(
    await recordLift(org, motor.id, rigger, {
      form: formAsPlanned(sealed, "Tomasz Wren", new Date(landed - 20 * 60 * 1000), "Europe/London"),
      checklist,
      liftedAt: new Date(landed),
      notes: "Motor landed on its feet first time; shims kept with the old motor.",
      nearMiss: false,
      nearMissDetails: "",
    }),
    "record the motor lift",
  );
}
