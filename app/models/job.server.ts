import {
  DataTypes,
  Model,
  QueryTypes,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type NonAttribute,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";
import { recordAudit } from "~/models/audit-event.server";
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

export type JobStatus = "open" | "closed";

/** A job is a work order at a customer site; it holds the lifts planned for it. */
export class Job extends Model<InferAttributes<Job>, InferCreationAttributes<Job>> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare siteId: number;
  declare workOrder: string;
  declare title: string;
  declare description: CreationOptional<string>;
  declare status: CreationOptional<JobStatus>;
  declare startsOn: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
  declare site?: NonAttribute<Site>;
}

Job.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: { type: DataTypes.INTEGER, allowNull: false },
    siteId: { type: DataTypes.INTEGER, allowNull: false },
    workOrder: { type: DataTypes.STRING(60), allowNull: false },
    title: { type: DataTypes.STRING(200), allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: "open" },
    startsOn: { type: DataTypes.DATEONLY, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: "jobs", underscored: true },
);

Job.belongsTo(Site, { foreignKey: "siteId", as: "site" });
Site.hasMany(Job, { foreignKey: "siteId", as: "jobs" });

export type JobInput = {
  siteId: number;
  workOrder: string;
  title: string;
  description: string;
  status: JobStatus;
  startsOn: string | null;
};

export async function listJobs(organisationId: number, options: { siteId?: number } = {}) {
  return Job.findAll({
    where: { organisationId, ...(options.siteId ? { siteId: options.siteId } : {}) },
    include: [{ model: Site, as: "site" }],
    order: [
      ["status", "DESC"],
      ["startsOn", "ASC NULLS FIRST"],
      ["workOrder", "ASC"],
    ],
  });
}

export type JobListRow = {
  id: number;
  workOrder: string;
  title: string;
  status: JobStatus;
  startsOn: string | null;
  site: string;
  customer: string;
};

/** Open jobs first, then by start date (none first), work order and id: the order of `listJobs`. */
export const JOB_LIST_KEYS: SortKey[] = [
  { sql: "j.status", direction: "DESC" },
  { sql: "COALESCE(CAST(j.starts_on AS TEXT), '')", direction: "ASC" },
  { sql: "j.work_order", direction: "ASC" },
  { sql: "j.id", direction: "ASC" },
];
const JOB_KEYSET = keysetSql(JOB_LIST_KEYS);

/** Fixed conditions for the list's filters, so each way of listing keeps its own plan (and the index on site). */
const JOB_SITE_FILTER = { any: "TRUE", one: "j.site_id = $siteId" } as const;
const JOB_STATUS_FILTER = { any: "TRUE", one: "j.status = $status" } as const;

/** One page of the organisation's jobs (optionally one site's, or only open ones), with the columns a list shows. */
export async function listJobsPage(
  organisationId: number,
  request: PageRequest,
  options: { siteId?: number; status?: JobStatus } = {},
): Promise<Page<JobListRow>> {
  const way = keysetWay(request);
  const rows = await sequelize.query<JobListRow>(
    `SELECT j.id AS id, j.work_order AS "workOrder", j.title AS title, j.status AS status, j.starts_on AS "startsOn",
            COALESCE(s.name, '') AS site, COALESCE(s.customer, '') AS customer
       FROM jobs j LEFT JOIN sites s ON s.id = j.site_id
      WHERE j.organisation_id = $organisationId
        AND ${JOB_SITE_FILTER[options.siteId === undefined ? "any" : "one"]}
        AND ${JOB_STATUS_FILTER[options.status === undefined ? "any" : "one"]}
        AND ${JOB_KEYSET[way].where}
      ORDER BY ${JOB_KEYSET[way].order} LIMIT $limit`,
    {
      bind: {
        organisationId,
        ...(options.siteId === undefined ? {} : { siteId: options.siteId }),
        ...(options.status === undefined ? {} : { status: options.status }),
        ...keysetBind(request),
      },
      type: QueryTypes.SELECT,
    },
  );
  return pageOf(rows, request, (j) => [j.status, j.startsOn ?? "", j.workOrder, j.id]);
}

/** How many open jobs the organisation has. */
export async function countOpenJobs(organisationId: number) {
  return Job.count({ where: { organisationId, status: "open" } });
}

export async function getJob(organisationId: number, jobId: number, transaction?: Transaction) {
  return Job.findOne({ where: { organisationId, id: jobId }, include: [{ model: Site, as: "site" }], transaction });
}

export async function isWorkOrderTaken(organisationId: number, workOrder: string, exceptJobId?: number) {
  const job = await Job.findOne({ where: { organisationId, workOrder } });
  return !!job && job.id !== exceptJobId;
}

export async function createJob(organisationId: number, input: JobInput, actorId: number) {
  return sequelize.transaction(async (transaction) => {
    const job = await Job.create({ organisationId, ...input }, { transaction });
    await recordAudit(
      { organisationId, userId: actorId, entity: "job", entityId: job.id, action: "created" },
      transaction,
    );
    return job;
  });
}

export async function updateJob(organisationId: number, jobId: number, input: JobInput, actorId: number) {
  return sequelize.transaction(async (transaction) => {
    const [count] = await Job.update(input, { where: { organisationId, id: jobId }, transaction });
    if (count)
      await recordAudit(
        { organisationId, userId: actorId, entity: "job", entityId: jobId, action: "updated" },
        transaction,
      );
    return count === 1;
  });
}
