import {
  DataTypes,
  Op,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Transaction,
} from "sequelize";
import { componentDefinitionSchema, type ComponentDefinition } from "~/loads/component-definition";
import { getOrganisationToday } from "~/models/organisation.server";
import { sequelize } from "~/utils/db.server";
import { recordAudit } from "~/models/audit-event.server";
import { Component, getComponent, toDefinition } from "~/models/component.server";
import { Job } from "~/models/job.server";
import { Site } from "~/models/site.server";
import { getReferenceTables } from "~/models/reference-row.server";
import {
  arrangementSchema,
  defaultArrangement,
  applyLoadEdit,
  defaultDetails,
  detailsSchema,
  diffComponentDefinitions,
  fitToSnapshot,
  riggingAllocationSchema,
  snapshotIssues,
  type Arrangement,
  type ComponentChange,
  type LoadEdit,
  type PlanDetails,
  type PlanDocument,
  type PlanIssue,
  type PlanResults,
  type PlanStatus,
  type RiggingAllocation,
} from "~/plans/document";
import { computePlanResults } from "~/plans/results.server";

/** A lift plan: one lift of one job; its content lives in its revisions. */
export class Plan extends Model<InferAttributes<Plan>, InferCreationAttributes<Plan>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare jobId: number;
  declare title: string;
  declare createdBy: number;
  declare currentRevisionId: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare job?: NonAttribute<Job>;
  declare currentRevision?: NonAttribute<PlanRevision | null>;
}

/** One revision of a plan; a draft is edited in place under an optimistic lock (`version`). */
export class PlanRevision extends Model<InferAttributes<PlanRevision>, InferCreationAttributes<PlanRevision>> {
  declare id: CreationOptional<number>;
  declare planId: number;
  declare revision: number;
  declare status: CreationOptional<PlanStatus>;
  declare version: CreationOptional<number>;
  declare componentId: number | null;
  declare componentVersion: number | null;
  declare loadSnapshot: string;
  declare arrangement: string;
  declare rigging: string;
  declare craneItemId: number | null;
  declare results: string;
  declare details: string;
  declare plannedBy: number;
  declare submittedBy: CreationOptional<number | null>;
  declare submittedAt: CreationOptional<Date | null>;
  declare approvedBy: CreationOptional<number | null>;
  declare approvedAt: CreationOptional<Date | null>;
  declare approverName: CreationOptional<string | null>;
  declare approvalComment: CreationOptional<string | null>;
  declare selfApproved: CreationOptional<boolean>;
  declare fingerprint: CreationOptional<string | null>;
  declare verifyToken: CreationOptional<string | null>;
  declare assignedRiggerId: CreationOptional<number | null>;
  declare supersededByRevision: CreationOptional<number | null>;
  declare closedReason: CreationOptional<string | null>;
  declare closedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

Plan.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: { type: DataTypes.INTEGER, allowNull: false },
    jobId: { type: DataTypes.INTEGER, allowNull: false },
    title: { type: DataTypes.STRING(200), allowNull: false },
    createdBy: { type: DataTypes.INTEGER, allowNull: false },
    currentRevisionId: { type: DataTypes.INTEGER, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "plans", underscored: true },
);

PlanRevision.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    planId: { type: DataTypes.INTEGER, allowNull: false },
    revision: { type: DataTypes.INTEGER, allowNull: false },
    status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: "draft" },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    componentId: { type: DataTypes.INTEGER, allowNull: true },
    componentVersion: { type: DataTypes.INTEGER, allowNull: true },
    loadSnapshot: { type: DataTypes.TEXT, allowNull: false },
    arrangement: { type: DataTypes.TEXT, allowNull: false },
    rigging: { type: DataTypes.TEXT, allowNull: false },
    craneItemId: { type: DataTypes.INTEGER, allowNull: true },
    results: { type: DataTypes.TEXT, allowNull: false },
    details: { type: DataTypes.TEXT, allowNull: false },
    plannedBy: { type: DataTypes.INTEGER, allowNull: false },
    submittedBy: { type: DataTypes.INTEGER, allowNull: true },
    submittedAt: { type: DataTypes.DATE, allowNull: true },
    approvedBy: { type: DataTypes.INTEGER, allowNull: true },
    approvedAt: { type: DataTypes.DATE, allowNull: true },
    approverName: { type: DataTypes.STRING(200), allowNull: true },
    approvalComment: { type: DataTypes.TEXT, allowNull: true },
    selfApproved: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    fingerprint: { type: DataTypes.STRING(64), allowNull: true },
    verifyToken: { type: DataTypes.STRING(64), allowNull: true },
    assignedRiggerId: { type: DataTypes.INTEGER, allowNull: true },
    supersededByRevision: { type: DataTypes.INTEGER, allowNull: true },
    closedReason: { type: DataTypes.TEXT, allowNull: true },
    closedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "plan_revisions", underscored: true },
);

Plan.belongsTo(Job, { foreignKey: "jobId", as: "job" });
Plan.belongsTo(PlanRevision, { foreignKey: "currentRevisionId", as: "currentRevision", constraints: false });
PlanRevision.belongsTo(Plan, { foreignKey: "planId", as: "plan" });

const ENTITY = "plan";

/** A revision's JSON columns, parsed. Stored documents were checked on the way in; the snapshot is re-checked as the one the statics read. */
export function readRevision(revision: PlanRevision) {
  return {
    id: revision.id,
    revision: revision.revision,
    status: revision.status as PlanStatus,
    version: revision.version,
    componentId: revision.componentId,
    componentVersion: revision.componentVersion,
    snapshot: componentDefinitionSchema.parse(JSON.parse(revision.loadSnapshot)) as ComponentDefinition,
    arrangement: arrangementSchema.parse(JSON.parse(revision.arrangement)) as Arrangement,
    rigging: riggingAllocationSchema.parse(JSON.parse(revision.rigging)) as RiggingAllocation,
    details: detailsSchema.parse(JSON.parse(revision.details)) as PlanDetails,
    results: JSON.parse(revision.results) as PlanResults,
    plannedBy: revision.plannedBy,
    submittedBy: revision.submittedBy ?? null,
    submittedAt: revision.submittedAt ?? null,
    approvedBy: revision.approvedBy ?? null,
    approvedAt: revision.approvedAt ?? null,
    approverName: revision.approverName ?? null,
    approvalComment: revision.approvalComment ?? null,
    selfApproved: revision.selfApproved ?? false,
    fingerprint: revision.fingerprint ?? null,
    assignedRiggerId: revision.assignedRiggerId ?? null,
    supersededByRevision: revision.supersededByRevision ?? null,
    closedReason: revision.closedReason ?? null,
    closedAt: revision.closedAt ?? null,
    updatedAt: revision.updatedAt,
  };
}
export type RevisionView = ReturnType<typeof readRevision>;

const withCurrent = [
  { model: PlanRevision, as: "currentRevision" },
  { model: Job, as: "job", include: [{ model: Site, as: "site" }] },
];

export type PlanListRow = {
  id: number;
  title: string;
  status: PlanStatus;
  revision: number;
  version: number;
  jobId: number;
  job: { id: number; workOrder: string; title: string };
};

/** The organisation's plans (optionally one job's), newest first, with their current revision's status. */
export async function listPlans(organisationId: number, options: { jobId?: number } = {}): Promise<PlanListRow[]> {
  const plans = await Plan.findAll({
    where: { organisationId, ...(options.jobId !== undefined ? { jobId: options.jobId } : {}) },
    include: [
      { model: PlanRevision, as: "currentRevision", attributes: ["id", "revision", "status", "version"] },
      { model: Job, as: "job", attributes: ["id", "workOrder", "title"] },
    ],
    order: [["id", "DESC"]],
  });
  return plans.map((p) => ({
    id: p.id,
    title: p.title,
    status: p.currentRevision?.status ?? "draft",
    revision: p.currentRevision?.revision ?? 1,
    version: p.currentRevision?.version ?? 1,
    jobId: p.jobId,
    job: { id: p.jobId, workOrder: p.job?.workOrder ?? "", title: p.job?.title ?? "" },
  }));
}

/** The plan with its job, site and current revision; null when it is not the organisation's. */
export async function getPlan(organisationId: number, planId: number, transaction?: Transaction) {
  if (!Number.isSafeInteger(planId)) return null;
  const plan = await Plan.findOne({ where: { organisationId, id: planId }, include: withCurrent, transaction });
  if (!plan || !plan.currentRevision) return null;
  return { plan, revision: readRevision(plan.currentRevision) };
}

/** Whether the organisation has this plan: a cheap check for actions that answer another organisation's plan with 404 first. */
export async function planExists(organisationId: number, planId: number): Promise<boolean> {
  if (!Number.isSafeInteger(planId)) return false;
  return (await Plan.count({ where: { organisationId, id: planId } })) > 0;
}

export type CreatePlanResult =
  { ok: true; plan: Plan } | { ok: false; field: "jobId" | "componentId"; message: string };

/** A new plan with revision 1 (draft): the component's definition copied in, a default arrangement and sequence, results computed. */
export async function createPlanFromComponent(
  organisationId: number,
  jobId: number,
  componentId: number,
  title: string,
  actorId: number,
): Promise<CreatePlanResult> {
  const tables = await getReferenceTables();
  return sequelize.transaction(async (transaction) => {
    const job = await Job.findOne({ where: { organisationId, id: jobId }, transaction });
    if (!job) return { ok: false, field: "jobId", message: "There is no such job in your organisation." };
    const component = await Component.findOne({
      where: { organisationId, id: componentId, archivedAt: null },
      include: [{ association: "liftPoints" }, { association: "parts" }],
      transaction,
    });
    if (!component)
      return { ok: false, field: "componentId", message: "There is no such component in your organisation." };
    const snapshot = toDefinition(component);
    if (snapshot.liftPoints.length === 0) {
      return {
        ok: false,
        field: "componentId",
        message: `${snapshot.name} has no lift points yet: add them to the component first.`,
      };
    }
    const arrangement = defaultArrangement(snapshot);
    const rigging: RiggingAllocation = { legs: {} };
    const details = defaultDetails();
    const results = await computePlanResults(
      snapshot,
      arrangement,
      rigging,
      organisationId,
      await getOrganisationToday(organisationId),
      {
        details,
        tables,
        transaction,
      },
    );
    const plan = await Plan.create(
      { organisationId, jobId, title, createdBy: actorId, currentRevisionId: null },
      { transaction },
    );
    const revision = await PlanRevision.create(
      {
        planId: plan.id,
        revision: 1,
        componentId: component.id,
        componentVersion: component.version,
        loadSnapshot: JSON.stringify(snapshot),
        arrangement: JSON.stringify(arrangement),
        rigging: JSON.stringify(rigging),
        craneItemId: null,
        results: JSON.stringify(results),
        details: JSON.stringify(details),
        plannedBy: actorId,
      },
      { transaction },
    );
    await plan.update({ currentRevisionId: revision.id }, { transaction });
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: ENTITY,
        entityId: plan.id,
        action: "created",
        details: { revision: 1, componentId, componentVersion: component.version },
      },
      transaction,
    );
    return { ok: true, plan };
  });
}

export type SaveResult =
  | { status: "saved"; version: number }
  | { status: "stale"; version: number }
  | { status: "frozen"; planStatus: PlanStatus }
  | { status: "not-found" }
  | { status: "invalid"; issues: PlanIssue[]; error: string };

async function lockedWrite(
  organisationId: number,
  planId: number,
  expectedVersion: number,
  transaction: Transaction,
): Promise<{ ok: true; found: NonNullable<Awaited<ReturnType<typeof getPlan>>> } | { ok: false; result: SaveResult }> {
  const found = await getPlan(organisationId, planId, transaction);
  if (!found) return { ok: false, result: { status: "not-found" } };
  if (!EDITABLE_STATUSES.includes(found.revision.status))
    return { ok: false, result: { status: "frozen", planStatus: found.revision.status } };
  if (found.revision.version !== expectedVersion)
    return { ok: false, result: { status: "stale", version: found.revision.version } };
  return { ok: true, found };
}

/** Revisions a planner may still change: drafts, and revisions returned with comments (saving one makes it a draft again). */
export const EDITABLE_STATUSES: readonly PlanStatus[] = ["draft", "returned"];

/** UPDATE ... WHERE version = expected AND status is editable; false when someone else got there first. */
async function updateDraft(
  revisionId: number,
  expectedVersion: number,
  values: Partial<InferAttributes<PlanRevision>>,
  transaction: Transaction,
) {
  const [count] = await PlanRevision.update(
    { ...values, status: "draft", version: expectedVersion + 1 },
    { where: { id: revisionId, version: expectedVersion, status: { [Op.in]: [...EDITABLE_STATUSES] } }, transaction },
  );
  return count === 1;
}

/**
 * Saves the draft revision's document when `expectedVersion` is still current, recomputing the results on
 * the server. Nothing is written unless everything is valid and the version matches.
 */
export async function savePlanRevision(
  organisationId: number,
  planId: number,
  expectedVersion: number,
  document: PlanDocument,
  actorId: number,
  loadEdit?: LoadEdit,
): Promise<SaveResult> {
  const tables = await getReferenceTables();
  return sequelize.transaction(async (transaction) => {
    const locked = await lockedWrite(organisationId, planId, expectedVersion, transaction);
    if (!locked.ok) return locked.result;
    const { plan, revision } = locked.found;
    const edited = applyLoadEdit(revision.snapshot, loadEdit);
    const snapshot = edited.snapshot;
    const issues = [...edited.issues, ...snapshotIssues(document, snapshot)];
    if (issues.length > 0)
      return { status: "invalid", issues, error: `The plan does not fit its load: ${issues[0]!.message}` };
    const results = await computePlanResults(
      snapshot,
      document.arrangement,
      document.rigging,
      organisationId,
      await getOrganisationToday(organisationId),
      {
        details: document.details,
        tables,
        transaction,
      },
    );
    if (results.status === 400)
      return { status: "invalid", issues: results.body.issues as PlanIssue[], error: results.body.error };
    const written = await updateDraft(
      revision.id,
      expectedVersion,
      {
        ...(loadEdit ? { loadSnapshot: JSON.stringify(snapshot) } : {}),
        arrangement: JSON.stringify(document.arrangement),
        rigging: JSON.stringify(document.rigging),
        details: JSON.stringify(document.details),
        craneItemId: document.rigging.craneItemId ?? null,
        results: JSON.stringify(results),
        plannedBy: actorId,
      },
      transaction,
    );
    if (!written) return { status: "stale", version: expectedVersion };
    if (document.title !== plan.title) await plan.update({ title: document.title }, { transaction });
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: ENTITY,
        entityId: plan.id,
        action: "saved",
        details: { revision: revision.revision, version: expectedVersion + 1, resultStatus: results.status },
      },
      transaction,
    );
    return { status: "saved", version: expectedVersion + 1 };
  });
}

export type PullResult =
  | { status: "pulled"; version: number; changes: ComponentChange[]; componentVersion: number }
  | { status: "up-to-date" }
  | { status: "no-component" }
  | Extract<SaveResult, { status: "stale" | "frozen" | "not-found" }>;

/**
 * Replaces the draft's load snapshot with the component's current definition, drops lift points the
 * component no longer has from the arrangement and rigging, recomputes, and says what changed.
 */
export async function pullComponentVersion(
  organisationId: number,
  planId: number,
  expectedVersion: number,
  actorId: number,
): Promise<PullResult> {
  const tables = await getReferenceTables();
  return sequelize.transaction(async (transaction) => {
    const locked = await lockedWrite(organisationId, planId, expectedVersion, transaction);
    if (!locked.ok) return locked.result as PullResult;
    const { plan, revision } = locked.found;
    if (revision.componentId === null) return { status: "no-component" };
    const component = await Component.findOne({
      where: { organisationId, id: revision.componentId },
      include: [{ association: "liftPoints" }, { association: "parts" }],
      transaction,
    });
    if (!component) return { status: "no-component" };
    if (component.version === revision.componentVersion) return { status: "up-to-date" };
    const snapshot = toDefinition(component);
    const changes = diffComponentDefinitions(revision.snapshot, snapshot);
    const fitted = fitToSnapshot(revision, snapshot);
    const results = await computePlanResults(
      snapshot,
      fitted.arrangement,
      fitted.rigging,
      organisationId,
      await getOrganisationToday(organisationId),
      {
        details: revision.details,
        tables,
        transaction,
      },
    );
    const written = await updateDraft(
      revision.id,
      expectedVersion,
      {
        loadSnapshot: JSON.stringify(snapshot),
        componentVersion: component.version,
        arrangement: JSON.stringify(fitted.arrangement),
        rigging: JSON.stringify(fitted.rigging),
        craneItemId: fitted.rigging.craneItemId ?? null,
        results: JSON.stringify(results),
      },
      transaction,
    );
    if (!written) return { status: "stale", version: expectedVersion };
    await recordAudit(
      {
        organisationId,
        userId: actorId,
        entity: ENTITY,
        entityId: plan.id,
        action: "component version pulled",
        details: {
          revision: revision.revision,
          from: revision.componentVersion,
          to: component.version,
          changes: changes.map((c) => c.message),
        },
      },
      transaction,
    );
    return { status: "pulled", version: expectedVersion + 1, changes, componentVersion: component.version };
  });
}

/** The component's current version and what differs from the plan's snapshot; null when the component is gone. */
export async function compareWithComponent(organisationId: number, revision: RevisionView) {
  if (revision.componentId === null) return null;
  // The version alone settles the usual case (nothing newer); the definition is read only to list changes.
  const latest = await Component.findOne({
    where: { organisationId, id: revision.componentId },
    attributes: ["id", "version"],
    raw: true,
  });
  if (!latest) return null;
  const newer = latest.version !== revision.componentVersion;
  const component = newer ? await getComponent(organisationId, revision.componentId) : null;
  return {
    componentId: latest.id,
    latestVersion: component?.version ?? latest.version,
    newer,
    changes: component ? diffComponentDefinitions(revision.snapshot, toDefinition(component)) : [],
  };
}
