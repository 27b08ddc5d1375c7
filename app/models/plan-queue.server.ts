// What waits for each role on the dashboard.
import { Job } from "~/models/job.server";
import { Plan, PlanRevision } from "~/models/plan.server";
import type { PlanStatus } from "~/plans/document";

export type QueueRow = {
  planId: number;
  title: string;
  revision: number;
  status: PlanStatus;
  workOrder: string;
  updatedAt: string;
};

const QUEUE_LIMIT = 20;

/**
 * The newest revisions matching `where` (one status, optionally one rigger). Only small columns are read, so
 * the (status, updated_at, ...) indexes of migration 0010 answer it without visiting the revisions' JSON.
 */
async function revisionsWhere(
  organisationId: number,
  where: Record<string, unknown>,
  limit = QUEUE_LIMIT,
): Promise<QueueRow[]> {
  const revisions = await PlanRevision.findAll({
    attributes: ["id", "planId", "revision", "status", "updatedAt"],
    where,
    include: [
      {
        model: Plan,
        as: "plan",
        attributes: ["id", "title", "jobId"],
        where: { organisationId },
        required: true,
        include: [{ model: Job, as: "job", attributes: ["workOrder"] }],
      },
    ],
    order: [["updatedAt", "DESC"]],
    limit,
  });
  return revisions.map((r) => {
    const plan = (r as unknown as { plan: Plan & { job?: Job } }).plan;
    return {
      planId: r.planId,
      title: plan.title,
      revision: r.revision,
      status: r.status,
      workOrder: plan.job?.workOrder ?? "",
      updatedAt: r.updatedAt.toISOString(),
    };
  });
}

/** Drafts and returned revisions a planner is working on, newest first. */
export async function plannerQueue(organisationId: number) {
  // One indexed, ordered read per status and a merge: an IN over both would sort every draft there is.
  const [drafts, returned] = await Promise.all([
    revisionsWhere(organisationId, { status: "draft" }),
    revisionsWhere(organisationId, { status: "returned" }),
  ]);
  return [...drafts, ...returned].sort((a, b) => b.updatedAt.localeCompare(a.updatedAt)).slice(0, QUEUE_LIMIT);
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
