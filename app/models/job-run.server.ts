import {
  DataTypes,
  Model,
  UniqueConstraintError,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from "sequelize";
import { sequelize } from "~/utils/db.server";

/** Scheduled work, named: each is done at most once per organisation and period. */
export type JobName = "examination-reminders";

/** The claim of one run of a job for one organisation and period (an organisation's day, "2031-05-10"). */
export class JobRun extends Model<InferAttributes<JobRun>, InferCreationAttributes<JobRun>> {
  declare id: CreationOptional<number>;
  declare job: JobName;
  declare organisationId: number;
  declare period: string;
  declare claimedAt: Date;
}

JobRun.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    job: { type: DataTypes.STRING(40), allowNull: false },
    organisationId: { type: DataTypes.INTEGER, allowNull: false },
    period: { type: DataTypes.STRING(20), allowNull: false },
    claimedAt: { type: DataTypes.DATE, allowNull: false },
  },
  { sequelize, tableName: "job_runs", underscored: true, timestamps: false },
);

/**
 * Claims `job` for the organisation and period: the claim's id, or null when a run (here or on another server)
 * claimed it first. The unique index decides, so two runs at once never both get a claim.
 */
export async function claimJobRun(
  job: JobName,
  organisationId: number,
  period: string,
  now: Date = new Date(),
): Promise<number | null> {
  try {
    const run = await JobRun.create({ job, organisationId, period, claimedAt: now });
    return run.id;
  } catch (error) {
    if (error instanceof UniqueConstraintError) return null;
    throw error;
  }
}

/** Gives a claim back (its work failed), so a later run may do the work. */
export async function releaseJobRun(id: number) {
  await JobRun.destroy({ where: { id } });
}
