import {
  DataTypes,
  Op,
  QueryTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Transaction,
} from "sequelize";
import { plannedLoad, readStoredLoad } from "~/plans/load-override";
import { sequelize } from "~/utils/db.server";
import { Job } from "~/models/job.server";
import { Site } from "~/models/site.server";
import {
  keysetBind,
  keysetSql,
  keysetWay,
  pageOf,
  type Page,
  type PageRequest,
  type SortKey,
} from "~/utils/keyset.server";
import {
  arrangementSchema,
  detailsSchema,
  riggingAllocationSchema,
  type Arrangement,
  type PlanDetails,
  type PlanResults,
  type PlanStatus,
  type RiggingAllocation,
} from "~/plans/document";

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
  /** The sealed record of an approved revision (JSON), written once in the approval's transaction. */
  declare sealed: CreationOptional<string | null>;
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
    sealed: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "plan_revisions", underscored: true },
);

Plan.belongsTo(Job, { foreignKey: "jobId", as: "job" });
Plan.belongsTo(PlanRevision, { foreignKey: "currentRevisionId", as: "currentRevision", constraints: false });
PlanRevision.belongsTo(Plan, { foreignKey: "planId", as: "plan" });

/** A revision's JSON columns, parsed. Stored documents were checked on the way in; the snapshot is re-checked as the one the statics read. */
export function readRevision(revision: PlanRevision) {
  // The stored copy holds the component's definition and the planner's override of its mass and CoG.
  const load = readStoredLoad(revision.loadSnapshot);
  return {
    id: revision.id,
    revision: revision.revision,
    status: revision.status as PlanStatus,
    version: revision.version,
    componentId: revision.componentId,
    componentVersion: revision.componentVersion,
    /** The load as planned: the component's definition with the override's mass and CoG. */
    snapshot: plannedLoad(load.component, load.override),
    /** The plan's copy of the component, without the override. */
    componentSnapshot: load.component,
    loadOverride: load.override,
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
};

/** Plans newest first: the id alone orders them. */
export const PLAN_LIST_KEYS: SortKey[] = [{ sql: "p.id", direction: "DESC" }];
const PLAN_KEYSET = keysetSql(PLAN_LIST_KEYS);
/** A job's plans or all of them, as fixed SQL (a job's plans read through the (organisation, job) index). */
const PLAN_SCOPE = { all: "1 = 1", job: "p.job_id = $jobId" } as const;

/**
 * One page of the organisation's plans (optionally one job's), newest first, with their current revision's status:
 * the listed columns only, never a revision's documents.
 */
export async function listPlansPage(
  organisationId: number,
  request: PageRequest,
  options: { jobId?: number } = {},
): Promise<Page<PlanListRow>> {
  const way = keysetWay(request);
  const rows = await sequelize.query<PlanListRow & { status: PlanStatus | null }>(
    `SELECT p.id AS id, p.title AS title, p.job_id AS "jobId",
            r.status AS status, r.revision AS revision, r.version AS version
       FROM plans p LEFT JOIN plan_revisions r ON r.id = p.current_revision_id
      WHERE p.organisation_id = $organisationId AND ${PLAN_SCOPE[options.jobId === undefined ? "all" : "job"]}
        AND ${PLAN_KEYSET[way].where}
      ORDER BY ${PLAN_KEYSET[way].order} LIMIT $limit`,
    {
      bind: {
        organisationId,
        ...(options.jobId === undefined ? {} : { jobId: options.jobId }),
        ...keysetBind(request),
      },
      type: QueryTypes.SELECT,
    },
  );
  return pageOf(
    rows.map((r) => ({ ...r, status: r.status ?? "draft", revision: r.revision ?? 1, version: r.version ?? 1 })),
    request,
    (r) => [r.id],
  );
}

/** The plan with its job, site and current revision; null when it is not the organisation's. */
export async function getPlan(organisationId: number, planId: number, transaction?: Transaction) {
  if (!Number.isSafeInteger(planId)) return null;
  const plan = await Plan.findOne({ where: { organisationId, id: planId }, include: withCurrent, transaction });
  if (!plan || !plan.currentRevision) return null;
  return { plan, revision: readRevision(plan.currentRevision) };
}

/** The plan row alone (no revision), or null when it is not the organisation's. */
export async function getPlanRow(organisationId: number, planId: number) {
  if (!Number.isSafeInteger(planId)) return null;
  return Plan.findOne({ where: { organisationId, id: planId } });
}

/** Whether the organisation has this plan: a cheap check for actions that answer another organisation's plan with 404 first. */
export async function planExists(organisationId: number, planId: number): Promise<boolean> {
  if (!Number.isSafeInteger(planId)) return false;
  return (await Plan.count({ where: { organisationId, id: planId } })) > 0;
}

/** Revisions a planner may still change: drafts, and revisions returned with comments (saving one makes it a draft again). */
export const EDITABLE_STATUSES: readonly PlanStatus[] = ["draft", "returned"];

/** UPDATE ... WHERE version = expected AND status is editable; false when someone else got there first. */
export async function updateDraftRevision(
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

/** What a new revision is made of (everything else starts empty). */
type RevisionValues = Pick<
  InferCreationAttributes<PlanRevision>,
  | "componentId"
  | "componentVersion"
  | "loadSnapshot"
  | "arrangement"
  | "rigging"
  | "craneItemId"
  | "results"
  | "details"
  | "plannedBy"
>;

/** A new plan and its first revision (a draft), the plan pointing at it. */
export async function insertPlanWithRevision(
  plan: Pick<InferCreationAttributes<Plan>, "organisationId" | "jobId" | "title" | "createdBy">,
  revision: RevisionValues,
  transaction: Transaction,
) {
  const created = await Plan.create({ ...plan, currentRevisionId: null }, { transaction });
  const first = await PlanRevision.create({ ...revision, planId: created.id, revision: 1 }, { transaction });
  await created.update({ currentRevisionId: first.id }, { transaction });
  return { plan: created, revision: first };
}

/** Revision n+1 of the plan, which becomes the plan's working revision. */
export async function insertNextRevision(plan: Plan, values: RevisionValues, transaction: Transaction) {
  const latest = (await PlanRevision.max("revision", { where: { planId: plan.id }, transaction })) as number;
  const revision = await PlanRevision.create({ ...values, planId: plan.id, revision: latest + 1 }, { transaction });
  await plan.update({ currentRevisionId: revision.id }, { transaction });
  return revision;
}

export async function setPlanTitle(plan: Plan, title: string, transaction: Transaction) {
  if (title !== plan.title) await plan.update({ title }, { transaction });
}

export type PlanForWorkflow = { plan: Plan; current: PlanRevision; approved: PlanRevision | null };

/** The plan, its working revision and its current approved revision (if any), read inside `transaction`. */
export async function getPlanForWorkflow(
  organisationId: number,
  planId: number,
  transaction?: Transaction,
): Promise<PlanForWorkflow | null> {
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

/** Every revision of the plan, in one read. */
export async function listPlanRevisions(planId: number) {
  return PlanRevision.findAll({ where: { planId } });
}

/** The columns that say where a revision stands and who is on it: never its documents, results or sealed record. */
const REVISION_SUMMARY = [
  "id",
  "planId",
  "revision",
  "status",
  "plannedBy",
  "submittedBy",
  "approvedBy",
  "assignedRiggerId",
  "supersededByRevision",
  "updatedAt",
] as const;

/** Every revision of the plan with the summary columns only (a plan with many revisions costs little more). */
export async function listRevisionSummaries(planId: number) {
  return PlanRevision.findAll({ where: { planId }, attributes: [...REVISION_SUMMARY] });
}

/** A revision as a print chooses and names it: where it stands and its seal (never its documents or sealed record). */
export type RevisionSeal = Pick<PlanRevision, "id" | "planId" | "revision" | "status" | "fingerprint" | "verifyToken">;

/**
 * The organisation's plan with every revision's standing and seal (fingerprint, verify token), in one statement;
 * null when the organisation has no such plan.
 */
export async function getPlanSeals(
  organisationId: number,
  planId: number,
): Promise<{ currentRevisionId: number | null; revisions: RevisionSeal[] } | null> {
  if (!Number.isSafeInteger(planId)) return null;
  const rows = await sequelize.query<RevisionSeal & { currentRevisionId: number | null }>(
    `SELECT p.current_revision_id AS "currentRevisionId", r.id AS id, r.plan_id AS "planId", r.revision AS revision,
            r.status AS status, r.fingerprint AS fingerprint, r.verify_token AS "verifyToken"
       FROM plans p LEFT JOIN plan_revisions r ON r.plan_id = p.id
      WHERE p.id = $planId AND p.organisation_id = $organisationId`,
    { bind: { planId, organisationId }, type: QueryTypes.SELECT },
  );
  if (rows.length === 0) return null;
  return {
    currentRevisionId: rows[0]!.currentRevisionId,
    revisions: rows
      .filter((r) => r.id !== null)
      .map(({ id, planId: plan, revision, status, fingerprint, verifyToken }) => ({
        id,
        planId: plan,
        revision,
        status,
        fingerprint,
        verifyToken,
      })),
  };
}

/** The revision's sealed record as stored (JSON), or null. */
export async function getRevisionSealed(planId: number, revisionId: number): Promise<string | null> {
  const row = await PlanRevision.findOne({ where: { id: revisionId, planId }, attributes: ["sealed"], raw: true });
  return row?.sealed ?? null;
}

/** One revision of the plan in full, or null. */
export async function getPlanRevision(planId: number, revisionId: number) {
  return PlanRevision.findOne({ where: { id: revisionId, planId } });
}

/** Sets values on the revision only while it still has status `from`; false when someone else moved it first. */
export async function moveRevision(
  revisionId: number,
  from: PlanStatus | readonly PlanStatus[],
  values: Partial<InferAttributes<PlanRevision>>,
  transaction: Transaction,
  extra: { version?: number } = {},
) {
  const [count] = await PlanRevision.update(values, {
    where: {
      id: revisionId,
      status: typeof from === "string" ? from : { [Op.in]: [...from] },
      ...(extra.version !== undefined ? { version: extra.version } : {}),
    },
    transaction,
  });
  return count === 1;
}

/** Cancels every open revision of the plan (draft, in review, returned, approved). */
export async function cancelOpenRevisions(planId: number, reason: string, transaction: Transaction) {
  await PlanRevision.update(
    { status: "cancelled", closedReason: reason, closedAt: new Date() },
    { where: { planId, status: { [Op.in]: ["draft", "in_review", "returned", "approved"] } }, transaction },
  );
}

/** The revision a printed QR code names, with its plan (any organisation: the token is the secret). */
export async function findRevisionByVerifyToken(token: string) {
  if (!/^[A-Za-z0-9_-]{10,64}$/.test(token)) return null;
  const revision = await PlanRevision.findOne({ where: { verifyToken: token } });
  if (!revision) return null;
  const plan = await Plan.findByPk(revision.planId);
  return plan ? { plan, revision } : null;
}

/** Approved revisions (any organisation's) by id, for re-checking their gear. */
export async function listApprovedRevisions(revisionIds: readonly number[]) {
  if (revisionIds.length === 0) return [];
  return PlanRevision.findAll({ where: { id: { [Op.in]: [...revisionIds] }, status: "approved" } });
}
