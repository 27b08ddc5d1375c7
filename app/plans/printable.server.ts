// Gathers what the printed plan shows, for the current approved revision only.
import { gearPicksByIds } from "~/gear/picks.server";
import { absoluteUrl } from "~/utils/mail.server";
import { Job } from "~/models/job.server";
import { getOrganisation } from "~/models/organisation.server";
import { getWorkflowView, PlanAcknowledgement } from "~/models/plan-workflow.server";
import { getPlan } from "~/models/plan.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { Site } from "~/models/site.server";
import { User, type SessionUser } from "~/models/user.server";
import type { RiggingAllocation } from "~/plans/document";
import type { PrintablePlan, PrintableScheduleRow } from "~/plans/printable";
import type { CheckResult } from "~/statics/checks";

type Slot = { position: string; itemId: number; checkId: string };

function slotsOf(rigging: RiggingAllocation): Slot[] {
  const slots: Slot[] = [];
  for (const [leg, r] of Object.entries(rigging.legs)) {
    if (r.eyeboltItemId)
      slots.push({ position: `Leg ${leg} eyebolt`, itemId: r.eyeboltItemId, checkId: `eyebolt-${leg}` });
    if (r.shackleItemId)
      slots.push({ position: `Leg ${leg} shackle`, itemId: r.shackleItemId, checkId: `shackle-${leg}` });
    if (r.slingItemId) slots.push({ position: `Leg ${leg} sling`, itemId: r.slingItemId, checkId: `sling-leg-${leg}` });
  }
  if (rigging.masterLinkItemId)
    slots.push({ position: "Master link", itemId: rigging.masterLinkItemId, checkId: "master-link" });
  if (rigging.craneItemId)
    slots.push({ position: "Crane or hoist", itemId: rigging.craneItemId, checkId: "crane-load" });
  return slots;
}

export type PrintableOutcome =
  { ok: true; printable: PrintablePlan; revision: number } | { ok: false; status: 404 | 409; message: string };

/** The printable plan for the plan's current approved revision; 409 when it has none (drafts and superseded revisions never print). */
export async function buildPrintablePlan(
  user: SessionUser,
  planId: number,
  request: Request,
): Promise<PrintableOutcome> {
  const found = await getPlan(user.organisationId, planId);
  if (!found) return { ok: false, status: 404, message: "There is no such plan in your organisation." };
  const workflow = await getWorkflowView(user.organisationId, planId, user, found);
  const approved = workflow?.approved;
  if (!workflow || !approved || approved.status !== "approved" || !workflow.permissions.print.allowed) {
    return {
      ok: false,
      status: 409,
      message:
        "Only the current approved revision can be printed. This plan has none: a draft, a revision in review, a superseded, completed or cancelled revision is never printed.",
    };
  }
  if (approved.results.status !== 200 || !approved.fingerprint || !approved.verifyToken || !approved.approvedAt) {
    return {
      ok: false,
      status: 409,
      message:
        "The approved revision is missing its results or signature; ask the appointed person to review it again.",
    };
  }
  const organisation = await getOrganisation(user.organisationId);
  const job = await Job.findOne({
    where: { id: found.plan.jobId, organisationId: user.organisationId },
    include: [{ model: Site, as: "site" }],
  });
  const planner = await User.findByPk(approved.plannedBy);
  const checks: CheckResult[] = approved.results.body.checks ?? [];
  const slots = slotsOf(approved.rigging);
  const picks = new Map(
    (
      await gearPicksByIds(
        user.organisationId,
        slots.map((s) => s.itemId),
        await getReferenceTables(),
      )
    ).map((p) => [p.id, p]),
  );
  const schedule: PrintableScheduleRow[] = slots.map((slot) => {
    const pick = picks.get(slot.itemId);
    const check = checks.find((c) => c.id === slot.checkId);
    return {
      position: slot.position,
      itemCode: pick?.itemCode ?? `#${slot.itemId}`,
      description: pick?.description ?? "",
      wllKg: pick?.wllKg ?? 0,
      loadKg: check?.loadKg ?? null,
      utilisation: check?.utilisation ?? null,
      nextDueOn: pick?.nextDueOn ?? null,
    };
  });
  const now = new Date();
  return {
    ok: true,
    revision: approved.revision,
    printable: {
      organisationName: organisation?.name ?? user.organisationName,
      title: found.plan.title,
      site: { name: job?.site?.name ?? "", customer: job?.site?.customer ?? "", address: job?.site?.address ?? "" },
      job: { workOrder: job?.workOrder ?? "", title: job?.title ?? "" },
      revision: approved.revision,
      status: "approved",
      units: user.units,
      planner: { name: planner?.name ?? "unknown" },
      approval: {
        name: approved.approverName ?? "",
        role: "Appointed person",
        approvedAt: new Date(approved.approvedAt).toISOString(),
        comment: approved.approvalComment ?? "",
        selfApproved: approved.selfApproved,
      },
      fingerprint: approved.fingerprint,
      verifyUrl: absoluteUrl(`/verify/${approved.verifyToken}`, request),
      printedAt: now.toISOString(),
      printedBy: user.name,
      snapshot: approved.snapshot,
      arrangement: approved.arrangement,
      results: approved.results.body,
      schedule,
      details: approved.details,
      acknowledgements: await Promise.all(
        (await PlanAcknowledgement.findAll({ where: { revisionId: approved.id }, order: [["id", "ASC"]] })).map(
          async (a) => ({
            checkItem: a.checkItem,
            reason: a.reason,
            by: (await User.findByPk(a.userId))?.name ?? "unknown",
            at: a.createdAt.toISOString(),
          }),
        ),
      ),
    },
  };
}
