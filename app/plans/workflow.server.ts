import { getOrganisationToday } from "~/models/organisation.server";
// How a plan moves: submission, approval (which seals the revision), return, a new revision,
// cancelling and assigning the rigger. Each step re-reads the revision in a transaction, checks the
// workflow rules again and writes only with a conditional update, so two people acting at once
// cannot both win. Mail goes out after the transaction has committed.
import { randomBytes } from "node:crypto";
import type { Transaction } from "sequelize";
import { sequelize } from "~/utils/db.server";
import { recordAudit } from "~/models/audit-event.server";
import { addPlanComment } from "~/models/plan-comment.server";
import { listAcknowledgements, replaceAcknowledgements } from "~/models/plan-acknowledgement.server";
import {
  cancelOpenRevisions,
  EDITABLE_STATUSES,
  getPlanForWorkflow,
  insertNextRevision,
  moveRevision,
  readRevision,
  type RevisionView,
} from "~/models/plan.server";
import { listRevisionAuthors, recordRevisionAuthor } from "~/models/plan-revision-author.server";
import { addRevisionItems } from "~/models/plan-revision-item.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { getOrganisationUser, listUsersWithRole, verifyPassword, type SessionUser } from "~/models/user.server";
import { authorRefusal } from "~/plans/authorship";
import type { PlanResults, RiggingAllocation } from "~/plans/document";
import { loadPathGaps } from "~/plans/load-path";
import { mailApproved, mailReturned, mailRiggerAssigned, mailSubmitted } from "~/plans/notifications.server";
import { computePlanResults } from "~/plans/results.server";
import { buildSealedRecord, fingerprintOf } from "~/plans/seal.server";
import type { CheckResult } from "~/statics/checks";
import {
  ENTITY,
  fail,
  NOT_FOUND,
  refusal,
  type WorkflowFailure,
  type WorkflowResult,
} from "~/plans/workflow-context.server";

/** The plan's results worked out again today (inspection dates move), for submission and approval. */
async function freshResults(
  organisationId: number,
  view: RevisionView,
  transaction: Transaction,
): Promise<PlanResults> {
  return computePlanResults(
    view.snapshot,
    view.arrangement,
    view.rigging,
    organisationId,
    await getOrganisationToday(organisationId),
    {
      details: view.details,
      tables: await getReferenceTables(),
      transaction,
    },
  );
}

function hasAllocatedGear(rigging: RiggingAllocation): boolean {
  const legItems = Object.values(rigging.legs).some(
    (leg) => leg.eyeboltItemId !== undefined || leg.shackleItemId !== undefined || leg.slingItemId !== undefined,
  );
  return (
    legItems ||
    rigging.masterLinkItemId !== undefined ||
    rigging.craneItemId !== undefined ||
    rigging.beamItemId !== undefined
  );
}

function checksOf(results: PlanResults): CheckResult[] {
  return results.status === 200 ? (results.body.checks ?? []) : [];
}

/** The refusal naming each gap in the load path, or null when it is complete. */
function incompleteLoadPath(view: RevisionView, step: "Submission" | "Approval"): WorkflowFailure | null {
  const gaps = loadPathGaps(view.snapshot, view.arrangement, view.rigging);
  return gaps.length ? fail(409, `${step} is refused: the load path is not complete. ${gaps.join(" ")}`) : null;
}

// ----- submit -----

/** Submits the working revision for review: every check passes, or each warning is acknowledged with a reason. */
export async function submitRevision(
  organisationId: number,
  planId: number,
  user: SessionUser,
  acknowledgements: Record<string, string>,
  request?: Request,
): Promise<WorkflowResult> {
  const outcome = await sequelize.transaction(
    async (transaction): Promise<WorkflowResult<{ revision: number; title: string }>> => {
      const loaded = await getPlanForWorkflow(organisationId, planId, transaction);
      if (!loaded) return fail(404, NOT_FOUND);
      const refused = await refusal("submit", user, loaded, loaded.current);
      if (refused) return refused;
      const view = readRevision(loaded.current);
      const results = await freshResults(organisationId, view, transaction);
      if (results.status !== 200)
        return fail(
          409,
          `The lift cannot be worked out as laid out: ${results.body.error} Fix the layout before submitting.`,
        );
      const checks = checksOf(results);
      // Leg-angle checks come out with no gear at all, so "nothing checked" is judged by the allocation itself.
      if (checks.length === 0 || !hasAllocatedGear(view.rigging))
        return fail(409, "No gear is allocated, so nothing has been checked: allocate the rigging before submitting.");
      const incomplete = incompleteLoadPath(view, "Submission");
      if (incomplete) return incomplete;
      const failing = checks.filter((c) => c.status === "fail");
      if (failing.length)
        return fail(
          409,
          `${failing.length} check${failing.length > 1 ? "s fail" : " fails"}: ${failing.map((c) => c.item).join("; ")}. Change the layout or the gear first.`,
        );
      const warnings = checks.filter((c) => c.status === "warn");
      const missing = warnings.filter((w) => (acknowledgements[w.id] ?? "").trim().length < 5);
      if (missing.length)
        return fail(
          400,
          `Acknowledge each warning with a reason (5 characters or more): ${missing.map((w) => w.item).join("; ")}.`,
          `ack-${missing[0]!.id}`,
        );
      const moved = await moveRevision(
        loaded.current.id,
        EDITABLE_STATUSES,
        { status: "in_review", submittedBy: user.id, submittedAt: new Date(), results: JSON.stringify(results) },
        transaction,
        { version: loaded.current.version },
      );
      if (!moved) return fail(409, "The plan changed while you were submitting it; reload and try again.");
      const reasons = warnings.map((w) => ({ w, reason: acknowledgements[w.id]!.trim().slice(0, 2000) }));
      await replaceAcknowledgements(
        loaded.current.id,
        reasons.map(({ w, reason }) => ({
          checkId: w.id,
          checkItem: w.item,
          checkMessage: w.message,
          reason,
          userId: user.id,
        })),
        transaction,
      );
      const audit = { organisationId, userId: user.id, entity: ENTITY, entityId: planId };
      for (const { w, reason } of reasons)
        await recordAudit(
          { ...audit, action: "warning acknowledged", details: { revision: view.revision, check: w.item, reason } },
          transaction,
        );
      await recordAudit(
        { ...audit, action: "submitted for review", details: { revision: view.revision } },
        transaction,
      );
      await recordRevisionAuthor(loaded.current.id, user.id, "submitted", transaction);
      return { ok: true, revision: view.revision, title: loaded.plan.title };
    },
  );
  if (outcome.ok) {
    const approvers = (await listUsersWithRole(organisationId, "approver")).filter((a) => a.id !== user.id);
    await mailSubmitted(organisationId, approvers, user, { id: planId, ...outcome }, request);
  }
  return outcome;
}

// ----- approve and return -----

function normaliseName(name: string) {
  return name.trim().replace(/\s+/g, " ").toLowerCase();
}

/**
 * Approves the revision in review: a deliberate, signed act. The approver re-enters their password
 * and types their name; no author of the revision approves it unless the organisation allows it;
 * the load path must be complete and every allocated item in date and in service. Everything the
 * revision shows is sealed into one record, whose SHA-256 is its fingerprint. The previous approved
 * revision becomes superseded.
 */
export async function approveRevision(
  organisationId: number,
  planId: number,
  user: SessionUser,
  input: { password: string; typedName: string; comment: string },
  request?: Request,
): Promise<WorkflowResult> {
  if (!(await verifyPassword(user.id, input.password)))
    return fail(400, "That is not your password. Approval needs your own password, entered again.", "password");
  if (normaliseName(input.typedName) !== normaliseName(user.name))
    return fail(400, `Type your name as it is on your account (${user.name}) to sign the approval.`, "typedName");
  const outcome = await sequelize.transaction(
    async (
      transaction,
    ): Promise<WorkflowResult<{ revision: number; title: string; plannerId: number; selfApproved: boolean }>> => {
      const loaded = await getPlanForWorkflow(organisationId, planId, transaction);
      if (!loaded) return fail(404, NOT_FOUND);
      const authors = await listRevisionAuthors([loaded.current.id], transaction);
      const refused = await refusal("approve", user, loaded, loaded.current, { authors });
      if (refused) return refused;
      const view = readRevision(loaded.current);
      const results = await freshResults(organisationId, view, transaction);
      if (results.status !== 200)
        return fail(409, `The lift can no longer be worked out: ${results.body.error} Return the plan to the planner.`);
      const incomplete = incompleteLoadPath(view, "Approval");
      if (incomplete) return incomplete;
      const checks = checksOf(results);
      const inspection = checks.filter((c) => c.id.startsWith("inspection-") && c.status === "fail");
      if (inspection.length)
        return fail(
          409,
          `Approval is refused: ${inspection.map((c) => c.message).join(" ")} Every allocated item must be in date for thorough examination and in service.`,
        );
      const failing = checks.filter((c) => c.status === "fail");
      if (failing.length) return fail(409, `Approval is refused: ${failing.map((c) => c.message).join(" ")}`);
      const acknowledged = new Set((await listAcknowledgements(loaded.current.id, transaction)).map((a) => a.checkId));
      const newWarnings = checks.filter((c) => c.status === "warn" && !acknowledged.has(c.id));
      if (newWarnings.length)
        return fail(
          409,
          `New warnings since the plan was submitted: ${newWarnings.map((c) => c.item).join("; ")}. Return it so the planner can acknowledge them.`,
        );
      const now = new Date();
      const selfApproved =
        authorRefusal(authors, user.id) !== null || view.plannedBy === user.id || view.submittedBy === user.id;
      const comment = input.comment.trim().slice(0, 4000);
      const sealed = await buildSealedRecord(
        organisationId,
        {
          loaded,
          view,
          results: results.body,
          resultsComputedOn: results.computedOn,
          approver: user,
          approvedAt: now,
          comment,
          typedName: input.typedName,
          selfApproved,
        },
        transaction,
      );
      const fingerprint = fingerprintOf(sealed);
      const moved = await moveRevision(
        loaded.current.id,
        "in_review",
        {
          status: "approved",
          approvedBy: user.id,
          approvedAt: now,
          approverName: user.name,
          approvalComment: comment,
          selfApproved,
          fingerprint,
          verifyToken: randomBytes(18).toString("base64url"),
          results: JSON.stringify(results),
          sealed: JSON.stringify(sealed),
        },
        transaction,
      );
      if (!moved)
        return fail(409, "Someone else acted on this plan at the same moment; reload to see where it stands.");
      await addRevisionItems(
        loaded.current.id,
        sealed.schedule.map((s) => s.itemId),
        transaction,
      );
      const audit = { organisationId, userId: user.id, entity: ENTITY, entityId: planId };
      if (loaded.approved && loaded.approved.id !== loaded.current.id) {
        await moveRevision(
          loaded.approved.id,
          "approved",
          { status: "superseded", supersededByRevision: view.revision },
          transaction,
        );
        await recordAudit(
          { ...audit, action: "superseded", details: { revision: loaded.approved.revision, by: view.revision } },
          transaction,
        );
      }
      if (comment)
        await addPlanComment(
          { revisionId: loaded.current.id, userId: user.id, kind: "approval", body: comment },
          transaction,
        );
      await recordAudit(
        {
          ...audit,
          action: "approved",
          details: { revision: view.revision, fingerprint, selfApproved, typedName: input.typedName.trim() },
        },
        transaction,
      );
      return { ok: true, revision: view.revision, title: loaded.plan.title, plannerId: view.plannedBy, selfApproved };
    },
  );
  if (outcome.ok) {
    const planner = await getOrganisationUser(organisationId, outcome.plannerId);
    if (planner && planner.id !== user.id)
      await mailApproved(organisationId, planner, user, { id: planId, ...outcome }, request);
  }
  return outcome;
}

/** Returns the revision in review to the planner with the appointed person's comments. */
export async function returnRevision(
  organisationId: number,
  planId: number,
  user: SessionUser,
  comment: string,
  request?: Request,
): Promise<WorkflowResult> {
  const body = comment.trim();
  if (body.length < 5) return fail(400, "Say what the planner should change (5 characters or more).", "comment");
  const outcome = await sequelize.transaction(
    async (transaction): Promise<WorkflowResult<{ revision: number; title: string; plannerId: number }>> => {
      const loaded = await getPlanForWorkflow(organisationId, planId, transaction);
      if (!loaded) return fail(404, NOT_FOUND);
      const refused = await refusal("return", user, loaded, loaded.current);
      if (refused) return refused;
      if (!(await moveRevision(loaded.current.id, "in_review", { status: "returned" }, transaction)))
        return fail(409, "Someone else acted on this plan at the same moment; reload to see where it stands.");
      await addPlanComment(
        { revisionId: loaded.current.id, userId: user.id, kind: "return", body: body.slice(0, 4000) },
        transaction,
      );
      await recordAudit(
        {
          organisationId,
          userId: user.id,
          entity: ENTITY,
          entityId: planId,
          action: "returned with comments",
          details: { revision: loaded.current.revision, comment: body.slice(0, 4000) },
        },
        transaction,
      );
      return {
        ok: true,
        revision: loaded.current.revision,
        title: loaded.plan.title,
        plannerId: loaded.current.plannedBy,
      };
    },
  );
  if (outcome.ok) {
    const planner = await getOrganisationUser(organisationId, outcome.plannerId);
    if (planner) await mailReturned(organisationId, planner, user, { id: planId, ...outcome }, body, request);
  }
  return outcome;
}

// ----- revisions, cancelling, assigning -----

/** Starts revision n+1 as a draft copy of the current approved revision, which stays approved until the new one is. */
export async function startNewRevision(
  organisationId: number,
  planId: number,
  user: SessionUser,
): Promise<WorkflowResult<{ revision: number }>> {
  return sequelize.transaction(async (transaction) => {
    const loaded = await getPlanForWorkflow(organisationId, planId, transaction);
    if (!loaded) return fail(404, NOT_FOUND);
    if (!loaded.approved) return fail(409, "There is no approved revision to start from.");
    const refused = await refusal("new-revision", user, loaded, loaded.approved);
    if (refused) return refused;
    const a = loaded.approved;
    const revision = await insertNextRevision(
      loaded.plan,
      {
        componentId: a.componentId,
        componentVersion: a.componentVersion,
        loadSnapshot: a.loadSnapshot,
        arrangement: a.arrangement,
        rigging: a.rigging,
        craneItemId: a.craneItemId,
        results: a.results,
        details: a.details,
        plannedBy: user.id,
      },
      transaction,
    );
    await recordRevisionAuthor(revision.id, user.id, "started", transaction);
    await recordAudit(
      {
        organisationId,
        userId: user.id,
        entity: ENTITY,
        entityId: planId,
        action: "new revision started",
        details: { revision: revision.revision, from: a.revision },
      },
      transaction,
    );
    return { ok: true, revision: revision.revision };
  });
}

/** Cancels the plan: every open revision (draft, in review, returned, approved) becomes cancelled. */
export async function cancelPlan(
  organisationId: number,
  planId: number,
  user: SessionUser,
  reason: string,
): Promise<WorkflowResult> {
  const body = reason.trim();
  if (body.length < 5) return fail(400, "Say why the plan is cancelled (5 characters or more).", "reason");
  return sequelize.transaction(async (transaction) => {
    const loaded = await getPlanForWorkflow(organisationId, planId, transaction);
    if (!loaded) return fail(404, NOT_FOUND);
    const refused = await refusal("cancel", user, loaded, loaded.current);
    if (refused) return refused;
    await cancelOpenRevisions(planId, body.slice(0, 4000), transaction);
    await addPlanComment(
      { revisionId: loaded.current.id, userId: user.id, kind: "cancel", body: body.slice(0, 4000) },
      transaction,
    );
    await recordAudit(
      {
        organisationId,
        userId: user.id,
        entity: ENTITY,
        entityId: planId,
        action: "cancelled",
        details: { reason: body.slice(0, 4000) },
      },
      transaction,
    );
    return { ok: true };
  });
}

/** Assigns a rigger of the organisation to the current approved revision and tells them. */
export async function assignRigger(
  organisationId: number,
  planId: number,
  user: SessionUser,
  riggerId: number,
  request?: Request,
): Promise<WorkflowResult> {
  const riggers = await listUsersWithRole(organisationId, "rigger");
  const rigger = riggers.find((r) => r.id === riggerId);
  if (!rigger) return fail(400, "Choose one of your organisation's riggers.", "riggerId");
  const outcome = await sequelize.transaction(
    async (transaction): Promise<WorkflowResult<{ revision: number; title: string }>> => {
      const loaded = await getPlanForWorkflow(organisationId, planId, transaction);
      if (!loaded) return fail(404, NOT_FOUND);
      if (!loaded.approved) return fail(409, "Only an approved revision is given to a rigger.");
      const refused = await refusal("assign-rigger", user, loaded, loaded.approved);
      if (refused) return refused;
      await moveRevision(loaded.approved.id, "approved", { assignedRiggerId: rigger.id }, transaction);
      await recordAudit(
        {
          organisationId,
          userId: user.id,
          entity: ENTITY,
          entityId: planId,
          action: "rigger assigned",
          details: { revision: loaded.approved.revision, rigger: rigger.name },
        },
        transaction,
      );
      return { ok: true, revision: loaded.approved.revision, title: loaded.plan.title };
    },
  );
  if (outcome.ok) await mailRiggerAssigned(organisationId, rigger, user, { id: planId, ...outcome }, request);
  return outcome;
}
