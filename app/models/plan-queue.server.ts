// What waits for each role on the dashboard.
import { Op } from "sequelize";
import { Job } from "~/models/job.server";
import { Plan, PlanRevision } from "~/models/plan.server";
import type { PlanStatus } from "~/plan-document";

export type QueueRow = { planId: number; title: string; revision: number; status: PlanStatus; workOrder: string; updatedAt: string };

async function revisionsWhere(organisationId: number, where: Record<string, unknown>, limit = 20): Promise<QueueRow[]> {
  const revisions = await PlanRevision.findAll({
    where,
    include: [{ model: Plan, as: "plan", where: { organisationId }, required: true, include: [{ model: Job, as: "job", attributes: ["workOrder"] }] }],
    order: [["updatedAt", "DESC"]],
    limit,
  });
  return revisions.map((r) => {
    const plan = (r as unknown as { plan: Plan & { job?: Job } }).plan;
    return { planId: r.planId, title: plan.title, revision: r.revision, status: r.status, workOrder: plan.job?.workOrder ?? "", updatedAt: r.updatedAt.toISOString() };
  });
}

/** Drafts and returned revisions a planner is working on (their own first). */
export function plannerQueue(organisationId: number) {
  return revisionsWhere(organisationId, { status: { [Op.in]: ["draft", "returned"] } });
}

/** Revisions waiting for an appointed person's review. */
export function reviewQueue(organisationId: number) {
  return revisionsWhere(organisationId, { status: "in_review" });
}

/** Approved revisions assigned to this rigger, and approved ones nobody is assigned to yet. */
export async function riggerQueue(organisationId: number, riggerId: number) {
  const mine = await revisionsWhere(organisationId, { status: "approved", assignedRiggerId: riggerId });
  const unassigned = await revisionsWhere(organisationId, { status: "approved", assignedRiggerId: null });
  return { mine, unassigned };
}
