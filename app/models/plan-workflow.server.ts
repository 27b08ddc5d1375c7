// Review, approval, revisions and the lift itself. Each step re-reads the revision in a
// transaction, checks the workflow rules again and writes only with a conditional update, so two
// people acting at once cannot both win.
import { createHash, randomBytes } from "node:crypto";
import {
  DataTypes,
  Model,
  Op,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";
import { absoluteUrl, sendMail } from "~/utils/mail.server";
import { AuditEvent, recordAudit } from "~/models/audit-event.server";
import { getOrganisation } from "~/models/organisation.server";
import { getOrganisationToday } from "~/models/organisation.server";
import { Plan, PlanRevision, readRevision, type RevisionView } from "~/models/plan.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { listUsersWithRole, User, verifyPassword, type SessionUser } from "~/models/user.server";
import type { PlanResults, PlanStatus, RiggingAllocation } from "~/plans/document";
import { computePlanResults } from "~/plans/results.server";
import {
  permission,
  PRE_LIFT_CHECKLIST,
  type ChecklistId,
  type WorkflowAction,
  type WorkflowContext,
} from "~/plans/workflow";
import type { CheckResult } from "~/statics/checks";
import { transactionWithFiles, type CheckedUpload } from "~/utils/uploads.server";

export class PlanAcknowledgement extends Model<
  InferAttributes<PlanAcknowledgement>,
  InferCreationAttributes<PlanAcknowledgement>
> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare checkId: string;
  declare checkItem: string;
  declare checkMessage: string;
  declare reason: string;
  declare userId: number;
  declare createdAt: CreationOptional<Date>;
}

PlanAcknowledgement.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revisionId: { type: DataTypes.INTEGER, allowNull: false },
    checkId: { type: DataTypes.STRING(80), allowNull: false },
    checkItem: { type: DataTypes.STRING(300), allowNull: false },
    checkMessage: { type: DataTypes.TEXT, allowNull: false },
    reason: { type: DataTypes.TEXT, allowNull: false },
    userId: { type: DataTypes.INTEGER, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "plan_acknowledgements", underscored: true, updatedAt: false },
);

export class PlanComment extends Model<InferAttributes<PlanComment>, InferCreationAttributes<PlanComment>> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare userId: number;
  declare kind: "return" | "approval" | "cancel";
  declare body: string;
  declare createdAt: CreationOptional<Date>;
}

PlanComment.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revisionId: { type: DataTypes.INTEGER, allowNull: false },
    userId: { type: DataTypes.INTEGER, allowNull: false },
    kind: { type: DataTypes.STRING(20), allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "plan_comments", underscored: true, updatedAt: false },
);

export class LiftRecord extends Model<InferAttributes<LiftRecord>, InferCreationAttributes<LiftRecord>> {
  declare id: CreationOptional<number>;
  declare revisionId: number;
  declare checklist: string;
  declare liftedAt: Date;
  declare notes: string;
  declare nearMiss: boolean;
  declare nearMissDetails: string;
  declare recordedBy: number;
  declare createdAt: CreationOptional<Date>;
}

LiftRecord.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revisionId: { type: DataTypes.INTEGER, allowNull: false, unique: true },
    checklist: { type: DataTypes.TEXT, allowNull: false },
    liftedAt: { type: DataTypes.DATE, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false },
    nearMiss: { type: DataTypes.BOOLEAN, allowNull: false },
    nearMissDetails: { type: DataTypes.TEXT, allowNull: false },
    recordedBy: { type: DataTypes.INTEGER, allowNull: false },
    createdAt: DataTypes.DATE,
  },
  { sequelize, tableName: "lift_records", underscored: true, updatedAt: false },
);

export class LiftRecordPhoto extends Model<InferAttributes<LiftRecordPhoto>, InferCreationAttributes<LiftRecordPhoto>> {
  declare id: CreationOptional<number>;
  declare liftRecordId: number;
  declare storedFileId: number;
}

LiftRecordPhoto.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    liftRecordId: { type: DataTypes.INTEGER, allowNull: false },
    storedFileId: { type: DataTypes.INTEGER, allowNull: false },
  },
  { sequelize, tableName: "lift_record_photos", underscored: true, timestamps: false },
);

const ENTITY = "plan";

export type WorkflowFailure = { ok: false; status: 400 | 403 | 404 | 409; message: string; field?: string };
export type WorkflowResult<T = object> = ({ ok: true } & T) | WorkflowFailure;

const fail = (status: WorkflowFailure["status"], message: string, field?: string): WorkflowFailure => ({
  ok: false,
  status,
  message,
  field,
});

type Loaded = {
  plan: Plan;
  current: PlanRevision;
  approved: PlanRevision | null;
};

/** The plan, its working revision and its current approved revision (if any), read inside `transaction`. */
async function loadPlan(organisationId: number, planId: number, transaction?: Transaction): Promise<Loaded | null> {
  if (!Number.isSafeInteger(planId)) return null;
  const plan = await Plan.findOne({ where: { organisationId, id: planId }, transaction });
  if (!plan?.currentRevisionId) return null;
  const current = await PlanRevision.findOne({ where: { id: plan.currentRevisionId, planId }, transaction });
  if (!current) return null;
  const approved = await PlanRevision.findOne({
    where: { planId, status: "approved" },
    order: [["revision", "DESC"]],
    transaction,
  });
  return { plan, current, approved };
}

/** What the user may do with the plan's revisions: the working one and the current approved one. */
export async function workflowContext(
  user: SessionUser,
  loaded: Loaded,
  revision: PlanRevision,
  allowSelfApproval?: boolean,
): Promise<WorkflowContext> {
  allowSelfApproval ??= (await getOrganisation(user.organisationId))?.allowSelfApproval ?? false;
  return {
    status: revision.status,
    roles: user.roles,
    isOwnPlan: revision.plannedBy === user.id || revision.submittedBy === user.id,
    allowSelfApproval,
    isCurrentApproved: revision.status === "approved",
    hasNewerRevision: revision.status === "approved" && loaded.current.id !== revision.id,
  };
}

async function refusal(
  action: WorkflowAction,
  user: SessionUser,
  loaded: Loaded,
  revision: PlanRevision,
): Promise<WorkflowFailure | null> {
  const p = permission(action, await workflowContext(user, loaded, revision));
  return p.allowed
    ? null
    : fail(
        p.reason.startsWith("Only") || p.reason.startsWith("The rigger") || p.reason.startsWith("The appointed")
          ? 403
          : 409,
        p.reason,
      );
}

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
  return legItems || rigging.masterLinkItemId !== undefined || rigging.craneItemId !== undefined;
}

function checksOf(results: PlanResults): CheckResult[] {
  return results.status === 200 ? (results.body.checks ?? []) : [];
}

async function notify(
  organisationId: number,
  to: Array<{ name: string; email: string }>,
  subject: string,
  lines: string[],
  planId: number,
  request?: Request,
) {
  if (to.length === 0) return;
  const link = absoluteUrl(`/plans/${planId}`, request);
  await sendMail({
    organisationId,
    to: to.map((u) => `${u.name} <${u.email}>`),
    subject,
    text: [...lines, "", `Open the plan: ${link}`].join("\n"),
  });
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
      const loaded = await loadPlan(organisationId, planId, transaction);
      if (!loaded) return fail(404, "There is no such plan in your organisation.");
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
      const now = new Date();
      const [count] = await PlanRevision.update(
        { status: "in_review", submittedBy: user.id, submittedAt: now, results: JSON.stringify(results) },
        {
          where: { id: loaded.current.id, status: { [Op.in]: ["draft", "returned"] }, version: loaded.current.version },
          transaction,
        },
      );
      if (count !== 1) return fail(409, "The plan changed while you were submitting it; reload and try again.");
      await PlanAcknowledgement.destroy({ where: { revisionId: loaded.current.id }, transaction });
      for (const w of warnings) {
        await PlanAcknowledgement.create(
          {
            revisionId: loaded.current.id,
            checkId: w.id,
            checkItem: w.item,
            checkMessage: w.message,
            reason: acknowledgements[w.id]!.trim().slice(0, 2000),
            userId: user.id,
          },
          { transaction },
        );
        await recordAudit(
          {
            organisationId,
            userId: user.id,
            entity: ENTITY,
            entityId: planId,
            action: "warning acknowledged",
            details: { revision: view.revision, check: w.item, reason: acknowledgements[w.id]!.trim().slice(0, 2000) },
          },
          transaction,
        );
      }
      await recordAudit(
        {
          organisationId,
          userId: user.id,
          entity: ENTITY,
          entityId: planId,
          action: "submitted for review",
          details: { revision: view.revision },
        },
        transaction,
      );
      return { ok: true, revision: view.revision, title: loaded.plan.title };
    },
  );
  if (outcome.ok) {
    const approvers = (await listUsersWithRole(organisationId, "approver")).filter((a) => a.id !== user.id);
    await notify(
      organisationId,
      approvers,
      `Lift plan to review: ${outcome.title} (revision ${outcome.revision})`,
      [
        `${user.name} has submitted the lift plan "${outcome.title}", revision ${outcome.revision}, for your review.`,
        "Check it and approve it, or return it with comments.",
      ],
      planId,
      request,
    );
  }
  return outcome;
}

// ----- approve and return -----

function normaliseName(name: string) {
  return name.trim().replace(/\s+/g, " ").toLowerCase();
}

/** SHA-256 of the approved content: what was approved, by whom and when, in a canonical order. */
export function fingerprintOf(content: unknown): string {
  const canonical = (value: unknown): unknown => {
    if (Array.isArray(value)) return value.map(canonical);
    if (value && typeof value === "object" && !(value instanceof Date)) {
      return Object.fromEntries(
        Object.keys(value)
          .sort()
          .map((k) => [k, canonical((value as Record<string, unknown>)[k])]),
      );
    }
    return value;
  };
  return createHash("sha256")
    .update(JSON.stringify(canonical(content)))
    .digest("hex");
}

/**
 * Approves the revision in review: a deliberate, signed act. The approver re-enters their password
 * and types their name; nobody approves their own plan unless the organisation allows it; every
 * allocated item must be in date and in service. The previous approved revision becomes superseded.
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
      const loaded = await loadPlan(organisationId, planId, transaction);
      if (!loaded) return fail(404, "There is no such plan in your organisation.");
      const refused = await refusal("approve", user, loaded, loaded.current);
      if (refused) return refused;
      const view = readRevision(loaded.current);
      const results = await freshResults(organisationId, view, transaction);
      if (results.status !== 200)
        return fail(409, `The lift can no longer be worked out: ${results.body.error} Return the plan to the planner.`);
      const checks = checksOf(results);
      const inspection = checks.filter((c) => c.id.startsWith("inspection-") && c.status === "fail");
      if (inspection.length) {
        return fail(
          409,
          `Approval is refused: ${inspection.map((c) => c.message).join(" ")} Every allocated item must be in date for thorough examination and in service.`,
        );
      }
      const failing = checks.filter((c) => c.status === "fail");
      if (failing.length) return fail(409, `Approval is refused: ${failing.map((c) => c.message).join(" ")}`);
      const acknowledged = new Set(
        (await PlanAcknowledgement.findAll({ where: { revisionId: loaded.current.id }, transaction })).map(
          (a) => a.checkId,
        ),
      );
      const newWarnings = checks.filter((c) => c.status === "warn" && !acknowledged.has(c.id));
      if (newWarnings.length) {
        return fail(
          409,
          `New warnings since the plan was submitted: ${newWarnings.map((c) => c.item).join("; ")}. Return it so the planner can acknowledge them.`,
        );
      }
      const now = new Date();
      const selfApproved = view.plannedBy === user.id || view.submittedBy === user.id;
      const comment = input.comment.trim().slice(0, 4000);
      const fingerprint = fingerprintOf({
        plan: planId,
        revision: view.revision,
        title: loaded.plan.title,
        snapshot: view.snapshot,
        arrangement: view.arrangement,
        rigging: view.rigging,
        details: view.details,
        results,
        approvedBy: user.id,
        approverName: user.name,
        approvedAt: now.toISOString(),
        selfApproved,
      });
      const [count] = await PlanRevision.update(
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
        },
        { where: { id: loaded.current.id, status: "in_review" }, transaction },
      );
      if (count !== 1)
        return fail(409, "Someone else acted on this plan at the same moment; reload to see where it stands.");
      if (loaded.approved && loaded.approved.id !== loaded.current.id) {
        await PlanRevision.update(
          { status: "superseded", supersededByRevision: view.revision },
          { where: { id: loaded.approved.id, status: "approved" }, transaction },
        );
        await recordAudit(
          {
            organisationId,
            userId: user.id,
            entity: ENTITY,
            entityId: planId,
            action: "superseded",
            details: { revision: loaded.approved.revision, by: view.revision },
          },
          transaction,
        );
      }
      if (comment)
        await PlanComment.create(
          { revisionId: loaded.current.id, userId: user.id, kind: "approval", body: comment },
          { transaction },
        );
      await recordAudit(
        {
          organisationId,
          userId: user.id,
          entity: ENTITY,
          entityId: planId,
          action: "approved",
          details: { revision: view.revision, fingerprint, selfApproved, typedName: input.typedName.trim() },
        },
        transaction,
      );
      return { ok: true, revision: view.revision, title: loaded.plan.title, plannerId: view.plannedBy, selfApproved };
    },
  );
  if (outcome.ok) {
    const planner = await User.findByPk(outcome.plannerId);
    if (planner && planner.id !== user.id) {
      await notify(
        organisationId,
        [planner],
        `Lift plan approved: ${outcome.title} (revision ${outcome.revision})`,
        [
          `${user.name}, appointed person, approved revision ${outcome.revision} of "${outcome.title}".`,
          "It can now be printed and a rigger assigned.",
        ],
        planId,
        request,
      );
    }
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
      const loaded = await loadPlan(organisationId, planId, transaction);
      if (!loaded) return fail(404, "There is no such plan in your organisation.");
      const refused = await refusal("return", user, loaded, loaded.current);
      if (refused) return refused;
      const [count] = await PlanRevision.update(
        { status: "returned" },
        { where: { id: loaded.current.id, status: "in_review" }, transaction },
      );
      if (count !== 1)
        return fail(409, "Someone else acted on this plan at the same moment; reload to see where it stands.");
      await PlanComment.create(
        { revisionId: loaded.current.id, userId: user.id, kind: "return", body: body.slice(0, 4000) },
        { transaction },
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
    const planner = await User.findByPk(outcome.plannerId);
    if (planner) {
      await notify(
        organisationId,
        [planner],
        `Lift plan returned: ${outcome.title} (revision ${outcome.revision})`,
        [
          `${user.name}, appointed person, returned revision ${outcome.revision} of "${outcome.title}" with these comments:`,
          "",
          body,
        ],
        planId,
        request,
      );
    }
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
    const loaded = await loadPlan(organisationId, planId, transaction);
    if (!loaded) return fail(404, "There is no such plan in your organisation.");
    if (!loaded.approved) return fail(409, "There is no approved revision to start from.");
    const refused = await refusal("new-revision", user, loaded, loaded.approved);
    if (refused) return refused;
    const a = loaded.approved;
    const latest = (await PlanRevision.max("revision", { where: { planId }, transaction })) as number;
    const revision = await PlanRevision.create(
      {
        planId,
        revision: latest + 1,
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
      { transaction },
    );
    await loaded.plan.update({ currentRevisionId: revision.id }, { transaction });
    await recordAudit(
      {
        organisationId,
        userId: user.id,
        entity: ENTITY,
        entityId: planId,
        action: "new revision started",
        details: { revision: latest + 1, from: a.revision },
      },
      transaction,
    );
    return { ok: true, revision: latest + 1 };
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
    const loaded = await loadPlan(organisationId, planId, transaction);
    if (!loaded) return fail(404, "There is no such plan in your organisation.");
    const refused = await refusal("cancel", user, loaded, loaded.current);
    if (refused) return refused;
    const now = new Date();
    await PlanRevision.update(
      { status: "cancelled", closedReason: body.slice(0, 4000), closedAt: now },
      { where: { planId, status: { [Op.in]: ["draft", "in_review", "returned", "approved"] } }, transaction },
    );
    await PlanComment.create(
      { revisionId: loaded.current.id, userId: user.id, kind: "cancel", body: body.slice(0, 4000) },
      { transaction },
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
      const loaded = await loadPlan(organisationId, planId, transaction);
      if (!loaded) return fail(404, "There is no such plan in your organisation.");
      if (!loaded.approved) return fail(409, "Only an approved revision is given to a rigger.");
      const refused = await refusal("assign-rigger", user, loaded, loaded.approved);
      if (refused) return refused;
      await PlanRevision.update(
        { assignedRiggerId: rigger.id },
        { where: { id: loaded.approved.id, status: "approved" }, transaction },
      );
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
  if (outcome.ok) {
    await notify(
      organisationId,
      [rigger],
      `Lift assigned to you: ${outcome.title} (revision ${outcome.revision})`,
      [
        `${user.name} has assigned you the approved lift plan "${outcome.title}", revision ${outcome.revision}.`,
        "Print it, check the gear against its schedule, brief the crew and make the trial lift as it says.",
      ],
      planId,
      request,
    );
  }
  return outcome;
}

// ----- the lift -----

export type LiftRecordInput = {
  checklist: Record<ChecklistId, boolean>;
  liftedAt: Date;
  notes: string;
  nearMiss: boolean;
  nearMissDetails: string;
};

/** Records the lift on the current approved revision, which becomes completed; every checklist item must be ticked. */
export async function recordLift(
  organisationId: number,
  planId: number,
  user: SessionUser,
  input: LiftRecordInput,
  photos: readonly CheckedUpload[] = [],
): Promise<WorkflowResult> {
  const unticked = PRE_LIFT_CHECKLIST.filter((c) => !input.checklist[c.id]);
  if (unticked.length)
    return fail(
      400,
      `Tick every pre-lift check before recording the lift: ${unticked.map((c) => c.text.toLowerCase()).join("; ")}.`,
      `check-${unticked[0]!.id}`,
    );
  if (input.nearMiss && input.nearMissDetails.trim().length < 5)
    return fail(400, "Describe the near miss.", "nearMissDetails");
  if (input.liftedAt.getTime() > Date.now() + 5 * 60_000)
    return fail(400, "The lift time cannot be in the future.", "liftedAt");
  return transactionWithFiles(async (transaction, store): Promise<WorkflowResult> => {
    const loaded = await loadPlan(organisationId, planId, transaction);
    if (!loaded) return fail(404, "There is no such plan in your organisation.");
    if (!loaded.approved) return fail(409, "Only the current approved revision can be lifted and recorded.");
    const refused = await refusal("record-lift", user, loaded, loaded.approved);
    if (refused) return refused;
    const [count] = await PlanRevision.update(
      { status: "completed", closedAt: new Date() },
      { where: { id: loaded.approved.id, status: "approved" }, transaction },
    );
    if (count !== 1) return fail(409, "This lift has just been recorded by someone else.");
    const record = await LiftRecord.create(
      {
        revisionId: loaded.approved.id,
        checklist: JSON.stringify(input.checklist),
        liftedAt: input.liftedAt,
        notes: input.notes.trim().slice(0, 4000),
        nearMiss: input.nearMiss,
        nearMissDetails: input.nearMiss ? input.nearMissDetails.trim().slice(0, 4000) : "",
        recordedBy: user.id,
      },
      { transaction },
    );
    for (const photo of photos) {
      const stored = await store(photo, { organisationId, purpose: "photo", uploadedBy: user.id });
      await LiftRecordPhoto.create({ liftRecordId: record.id, storedFileId: stored.id }, { transaction });
    }
    await recordAudit(
      {
        organisationId,
        userId: user.id,
        entity: ENTITY,
        entityId: planId,
        action: "lift recorded",
        details: { revision: loaded.approved.revision, nearMiss: input.nearMiss },
      },
      transaction,
    );
    return { ok: true };
  });
}

// ----- reading -----

export type WorkflowView = {
  working: RevisionView;
  approved: (RevisionView & { verifyToken: string | null }) | null;
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
  const plan = found?.plan ?? (await Plan.findOne({ where: { organisationId, id: planId } }));
  if (!plan?.currentRevisionId || plan.organisationId !== organisationId) return null;
  // Every revision in one read: the working one, the current approved one, a completed one, and their numbers.
  const revisions = await PlanRevision.findAll({ where: { planId: plan.id } });
  const current = revisions.find((r) => r.id === plan.currentRevisionId);
  if (!current) return null;
  const loaded: Loaded = { plan, current, approved: latestWith(revisions, "approved") };
  const working = found && found.revision.id === current.id ? found.revision : readRevision(current);
  const approvedRow = loaded.approved ?? latestWith(revisions, "completed");
  const approved = approvedRow
    ? {
        ...(approvedRow.id === working.id ? working : readRevision(approvedRow)),
        verifyToken: approvedRow.verifyToken ?? null,
      }
    : null;
  const revisionsById = new Map(revisions.map((r) => [r.id, r.revision]));
  const users = new Map(
    (await User.findAll({ where: { organisationId }, attributes: ["id", "name"], raw: true })).map((u) => [
      u.id,
      u.name,
    ]),
  );
  const acknowledgements = (
    await PlanAcknowledgement.findAll({ where: { revisionId: loaded.current.id }, order: [["id", "ASC"]] })
  ).map((a) => ({
    checkItem: a.checkItem,
    checkMessage: a.checkMessage,
    reason: a.reason,
    by: users.get(a.userId) ?? "unknown",
    at: a.createdAt.toISOString(),
  }));
  const comments = (
    await PlanComment.findAll({
      where: { revisionId: { [Op.in]: [...revisionsById.keys()] } },
      order: [["id", "DESC"]],
    })
  ).map((c) => ({
    kind: c.kind,
    body: c.body,
    by: users.get(c.userId) ?? "unknown",
    at: c.createdAt.toISOString(),
    revision: revisionsById.get(c.revisionId) ?? 0,
  }));
  // Only recording the lift completes a revision, so only a completed one has a record.
  const record =
    approvedRow?.status === "completed" ? await LiftRecord.findOne({ where: { revisionId: approvedRow.id } }) : null;
  const photos = record
    ? (await LiftRecordPhoto.findAll({ where: { liftRecordId: record.id } })).map((p) => p.storedFileId)
    : [];
  const permissions = {} as WorkflowView["permissions"];
  const allowSelfApproval = (await getOrganisation(organisationId))?.allowSelfApproval ?? false;
  const workingCtx = await workflowContext(user, loaded, loaded.current, allowSelfApproval);
  const approvedCtx = loaded.approved ? await workflowContext(user, loaded, loaded.approved, allowSelfApproval) : null;
  for (const action of ["edit", "submit", "approve", "return", "cancel"] as const)
    permissions[action] = permission(action, workingCtx);
  for (const action of ["new-revision", "assign-rigger", "record-lift", "print"] as const) {
    permissions[action] = approvedCtx
      ? permission(action, approvedCtx)
      : { allowed: false, reason: "The plan has no approved revision yet." };
  }
  const riggerId = approvedRow?.assignedRiggerId ?? null;
  return {
    working,
    approved,
    acknowledgements,
    comments,
    liftRecord: record
      ? {
          liftedAt: record.liftedAt.toISOString(),
          notes: record.notes,
          nearMiss: record.nearMiss,
          nearMissDetails: record.nearMissDetails,
          by: users.get(record.recordedBy) ?? "unknown",
          checklist: JSON.parse(record.checklist) as Record<string, boolean>,
          photos,
        }
      : null,
    assignedRigger: riggerId ? { id: riggerId, name: users.get(riggerId) ?? "unknown" } : null,
    permissions,
  };
}

/** The plan's audit trail, oldest first, with who did each thing. Never editable. */
export async function listPlanHistory(organisationId: number, planId: number) {
  const events = await AuditEvent.findAll({
    where: { organisationId, entity: ENTITY, entityId: planId },
    order: [["id", "ASC"]],
  });
  const users = new Map(
    (await User.findAll({ where: { organisationId }, attributes: ["id", "name"] })).map((u) => [u.id, u.name]),
  );
  return events.map((e) => ({
    id: e.id,
    at: e.createdAt.toISOString(),
    by: e.userId ? (users.get(e.userId) ?? "unknown") : "system",
    action: e.action,
    details: e.details ? (JSON.parse(e.details) as Record<string, unknown>) : {},
  }));
}

export type VerifiedRevision = {
  title: string;
  site: string;
  revision: number;
  status: PlanStatus;
  supersededByRevision: number | null;
  approvedAt: string | null;
  approverName: string | null;
  fingerprint: string | null;
  organisationId: number;
  planId: number;
};

/** The revision a printed QR code points at (any organisation: the token itself is the secret). */
export async function findRevisionByVerifyToken(token: string): Promise<VerifiedRevision | null> {
  if (!/^[A-Za-z0-9_-]{10,64}$/.test(token)) return null;
  const revision = await PlanRevision.findOne({ where: { verifyToken: token } });
  if (!revision) return null;
  const plan = await Plan.findByPk(revision.planId, {
    include: [{ association: "job", include: [{ association: "site" }] }],
  });
  if (!plan) return null;
  const site = plan.job?.site;
  return {
    title: plan.title,
    site: site ? `${site.name} (${site.customer})` : "",
    revision: revision.revision,
    status: revision.status,
    supersededByRevision: revision.supersededByRevision ?? null,
    approvedAt: revision.approvedAt?.toISOString() ?? null,
    approverName: revision.approverName ?? null,
    fingerprint: revision.fingerprint ?? null,
    organisationId: plan.organisationId,
    planId: plan.id,
  };
}
