// Where a plan stands, for its pages: the working revision, the approved (or completed) one with its
// gear state now, acknowledgements, comments, the lift record and what the user may do next.
import { listAuditEvents, listAuditEventsPage } from "~/models/audit-event.server";
import { getOrganisationSettings } from "~/models/organisation.server";
import { getLiftRecord } from "~/models/lift-record.server";
import { listLiftRecordPhotoIds } from "~/models/lift-record-photo.server";
import { listAcknowledgements } from "~/models/plan-acknowledgement.server";
import { listPlanComments } from "~/models/plan-comment.server";
import {
  getPlanRevision,
  getPlanRow,
  listRevisionSummaries,
  readRevision,
  type Plan,
  type PlanForWorkflow,
  type PlanRevision,
  type RevisionView,
} from "~/models/plan.server";
import { listRevisionAuthors } from "~/models/plan-revision-author.server";
import { userNames, type SessionUser } from "~/models/user.server";
import type { PlanStatus } from "~/plans/document";
import { collapseEditingSessions } from "~/plans/history";
import { overrideMark } from "~/plans/load-override";
import { readLiftRecordDocument, type LiftRecordDocument } from "~/plans/lift-record";
import { notFitSentence, type LiveGearState } from "~/plans/live-state";
import { liveStateOf } from "~/plans/live-state.server";
import { readSealed, type SealedPlan } from "~/plans/sealed";
import { permission, type WorkflowAction } from "~/plans/workflow";
import { ENTITY, workflowContext } from "~/plans/workflow-context.server";
import type { Page, PageRequest } from "~/utils/keyset.server";

export type WorkflowView = {
  working: RevisionView;
  approved: (RevisionView & { verifyToken: string | null }) | null;
  /** The sealed record of the current approved revision, else of the completed one; null when there is none. */
  sealed: SealedPlan | null;
  /** The gear of the current approved revision judged now; null when there is none (or it was never sealed). */
  live: LiveGearState | null;
  acknowledgements: Array<{ checkItem: string; checkMessage: string; reason: string; by: string; at: string }>;
  comments: Array<{ kind: string; body: string; by: string; at: string; revision: number }>;
  liftRecord: {
    liftedAt: string;
    notes: string;
    nearMiss: boolean;
    nearMissDetails: string;
    by: string;
    checklist: Record<string, boolean>;
    photos: number[];
    /** Who ticked and released what and when, the gear confirmed, who was there; null on records made before. */
    document: LiftRecordDocument | null;
  } | null;
  assignedRigger: { id: number; name: string } | null;
  permissions: Record<WorkflowAction, { allowed: boolean; reason?: string }>;
};

/** The latest revision with `status`, if any. */
function latestWith(revisions: PlanRevision[], status: PlanStatus): PlanRevision | null {
  return revisions
    .filter((r) => r.status === status)
    .reduce<PlanRevision | null>((latest, r) => (!latest || r.revision > latest.revision ? r : latest), null);
}

/**
 * Everything the plan page needs about where the plan stands and what the user may do next. Pages that
 * have just read the plan with `getPlan` pass what they read (`found`), so it is not read again.
 */
export async function getWorkflowView(
  organisationId: number,
  planId: number,
  user: SessionUser,
  found?: { plan: Plan; revision: RevisionView },
): Promise<WorkflowView | null> {
  if (!Number.isSafeInteger(planId)) return null;
  const plan = found?.plan ?? (await getPlanRow(organisationId, planId));
  if (!plan?.currentRevisionId || plan.organisationId !== organisationId) return null;
  // Where every revision stands (no documents), then in full only the working one (already read with the plan
  // when the page read it) and the current approved or completed one.
  const revisions = await listRevisionSummaries(plan.id);
  if (!revisions.some((r) => r.id === plan.currentRevisionId)) return null;
  const inFull = async (summary: PlanRevision | null, known?: PlanRevision | null) =>
    !summary ? null : known?.id === summary.id ? known : await getPlanRevision(plan.id, summary.id);
  const current = await inFull(
    revisions.find((r) => r.id === plan.currentRevisionId)!,
    plan.currentRevision ?? null,
  );
  if (!current) return null;
  const loaded: PlanForWorkflow = { plan, current, approved: await inFull(latestWith(revisions, "approved"), current) };
  const working = found && found.revision.id === current.id ? found.revision : readRevision(current);
  const approvedRow = loaded.approved ?? (await inFull(latestWith(revisions, "completed"), current));
  const approved = approvedRow
    ? {
        ...(approvedRow.id === working.id ? working : readRevision(approvedRow)),
        verifyToken: approvedRow.verifyToken ?? null,
      }
    : null;
  const sealed = approvedRow ? readSealed(approvedRow.sealed) : null;
  const live = sealed && loaded.approved ? await liveStateOf(organisationId, sealed) : null;
  const revisionsById = new Map(revisions.map((r) => [r.id, r.revision]));
  const acknowledgementRows = await listAcknowledgements(loaded.current.id);
  const commentRows = await listPlanComments([...revisionsById.keys()]);
  // Only recording the lift completes a revision, so only a completed one has a record.
  const record = approvedRow?.status === "completed" ? await getLiftRecord(approvedRow.id) : null;
  const riggerId = approvedRow?.assignedRiggerId ?? null;
  const users = await userNames(organisationId, [
    ...acknowledgementRows.map((a) => a.userId),
    ...commentRows.map((c) => c.userId),
    ...(record ? [record.recordedBy] : []),
    ...(riggerId ? [riggerId] : []),
  ]);
  const allowSelfApproval = (await getOrganisationSettings(organisationId))?.allowSelfApproval ?? false;
  const authors = await listRevisionAuthors([loaded.current.id]);
  const workingCtx = await workflowContext(user, loaded, loaded.current, { allowSelfApproval, authors });
  const printableRow = loaded.approved ?? (approvedRow?.status === "completed" ? approvedRow : null);
  const approvedCtx = printableRow
    ? await workflowContext(user, loaded, printableRow, {
        allowSelfApproval,
        authors: [],
        ...(live && !live.fit ? { notFitToLift: notFitSentence(live) } : {}),
      })
    : null;
  const permissions = {} as WorkflowView["permissions"];
  for (const action of ["edit", "submit", "approve", "return", "cancel"] as const)
    permissions[action] = permission(action, workingCtx);
  for (const action of ["new-revision", "assign-rigger", "record-lift", "print"] as const) {
    permissions[action] = approvedCtx
      ? permission(action, approvedCtx)
      : { allowed: false, reason: "The plan has no approved revision yet." };
  }
  return {
    working,
    approved,
    sealed,
    live,
    acknowledgements: acknowledgementRows.map((a) => ({
      checkItem: a.checkItem,
      checkMessage: a.checkMessage,
      reason: a.reason,
      by: users.get(a.userId) ?? "unknown",
      at: a.createdAt.toISOString(),
    })),
    comments: commentRows.map((c) => ({
      kind: c.kind,
      body: c.body,
      by: users.get(c.userId) ?? "unknown",
      at: c.createdAt.toISOString(),
      revision: revisionsById.get(c.revisionId) ?? 0,
    })),
    liftRecord: record
      ? {
          liftedAt: record.liftedAt.toISOString(),
          notes: record.notes,
          nearMiss: record.nearMiss,
          nearMissDetails: record.nearMissDetails,
          by: users.get(record.recordedBy) ?? "unknown",
          checklist: JSON.parse(record.checklist) as Record<string, boolean>,
          photos: await listLiftRecordPhotoIds(record.id),
          document: readLiftRecordDocument(record.document),
        }
      : null,
    assignedRigger: riggerId ? { id: riggerId, name: users.get(riggerId) ?? "unknown" } : null,
    permissions,
  };
}

/**
 * The plan's audit trail, oldest first, a page of events at a time (all of them when no page is asked for), with who
 * did each thing and each editing session as one entry. Never editable.
 */
export async function listPlanHistory(organisationId: number, planId: number): Promise<HistoryEntry[]>;
export async function listPlanHistory(
  organisationId: number,
  planId: number,
  request: PageRequest,
): Promise<Page<HistoryEntry>>;
export async function listPlanHistory(organisationId: number, planId: number, request?: PageRequest) {
  const page = request
    ? await listAuditEventsPage(organisationId, ENTITY, planId, request)
    : { rows: await listAuditEvents(organisationId, ENTITY, planId), next: null, previous: null };
  const events = page.rows;
  const users = await userNames(
    organisationId,
    events.map((e) => e.userId).filter((id): id is number => id !== null),
  );
  const entries = collapseEditingSessions(
    events.map((e) => ({
      id: e.id,
      at: e.createdAt.toISOString(),
      userId: e.userId,
      by: e.userId ? (users.get(e.userId) ?? "unknown") : "system",
      action: e.action,
      details: e.details ? (JSON.parse(e.details) as Record<string, unknown>) : {},
    })),
  );
  return request ? { ...page, rows: entries } : entries;
}
type HistoryEntry = ReturnType<typeof collapseEditingSessions>[number];

/**
 * What the plan page shows of its working revision: once that revision is approved (or completed),
 * the sealed record and nothing read again from the plan, job or site rows.
 */
export function shownRevision(
  found: { plan: Plan; revision: RevisionView },
  workflow: Pick<WorkflowView, "sealed"> | null,
) {
  const { plan, revision } = found;
  const sealed = workflow?.sealed?.revision === revision.revision ? workflow.sealed : null;
  const site = plan.job?.site;
  if (!sealed)
    return {
      title: plan.title,
      job: {
        id: plan.jobId,
        workOrder: plan.job?.workOrder ?? "",
        title: plan.job?.title ?? "",
        site: site ? `${site.name} · ${site.customer}` : "",
      },
      revision: { ...revision, loadOverrideMark: overrideMark(revision.componentSnapshot, revision.loadOverride) },
    };
  return {
    title: sealed.title,
    job: {
      id: plan.jobId,
      workOrder: sealed.job.workOrder,
      title: sealed.job.title,
      site: `${sealed.site.name} · ${sealed.site.customer}`,
    },
    revision: {
      ...revision,
      snapshot: sealed.snapshot,
      loadOverrideMark: sealed.loadOverride ?? null,
      arrangement: sealed.arrangement,
      rigging: sealed.rigging,
      details: sealed.details,
      results: {
        status: 200 as const,
        kind: sealed.arrangement.kind,
        computedOn: sealed.resultsComputedOn,
        body: sealed.results,
      },
    },
  };
}
