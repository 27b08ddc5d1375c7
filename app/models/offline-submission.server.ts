import {
  DataTypes,
  Model,
  UniqueConstraintError,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Transaction,
} from "sequelize";
import { sequelize } from "~/utils/db.server";

export type SubmissionKind = "lift" | "defect";
/** pending: being done now; recorded: done; refused: the server would not do it (the work is kept in `payload`). */
export type SubmissionOutcome = "pending" | "recorded" | "refused";

/** A piece of work made on a phone without signal, named by the phone's id for it, and what became of it. */
export class OfflineSubmission extends Model<
  InferAttributes<OfflineSubmission>,
  InferCreationAttributes<OfflineSubmission>
> {
  declare id: CreationOptional<number>;
  declare organisationId: number;
  declare userId: number;
  declare clientId: string;
  declare kind: SubmissionKind;
  declare planId: number | null;
  declare gearItemId: number | null;
  declare liftRecordId: CreationOptional<number | null>;
  declare madeAt: Date;
  declare receivedAt: Date;
  declare outcome: SubmissionOutcome;
  declare message: CreationOptional<string>;
  /** JSON: what changed between the work being made and it arriving (live-state problems). */
  declare changes: CreationOptional<string>;
  /** JSON: the work as sent, kept when it was refused so nothing typed is lost. */
  declare payload: CreationOptional<string | null>;
}

OfflineSubmission.init(
  {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisationId: { type: DataTypes.INTEGER, allowNull: false },
    userId: { type: DataTypes.INTEGER, allowNull: false },
    clientId: { type: DataTypes.STRING(64), allowNull: false },
    kind: { type: DataTypes.STRING(12), allowNull: false },
    planId: { type: DataTypes.INTEGER, allowNull: true },
    gearItemId: { type: DataTypes.INTEGER, allowNull: true },
    liftRecordId: { type: DataTypes.INTEGER, allowNull: true },
    madeAt: { type: DataTypes.DATE, allowNull: false },
    receivedAt: { type: DataTypes.DATE, allowNull: false },
    outcome: { type: DataTypes.STRING(12), allowNull: false },
    message: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    changes: { type: DataTypes.TEXT, allowNull: false, defaultValue: "[]" },
    payload: { type: DataTypes.TEXT, allowNull: true },
  },
  { sequelize, tableName: "offline_submissions", underscored: true, timestamps: false },
);

export async function findSubmission(organisationId: number, clientId: string) {
  return OfflineSubmission.findOne({ where: { organisationId, clientId } });
}

/**
 * Claims the phone's id for this piece of work: the new row, or null when the id was already claimed (the work
 * arrived before, or is being done now).
 */
export async function claimSubmission(
  values: Pick<
    InferCreationAttributes<OfflineSubmission>,
    "organisationId" | "userId" | "clientId" | "kind" | "planId" | "gearItemId" | "madeAt" | "receivedAt"
  >,
): Promise<OfflineSubmission | null> {
  try {
    return await OfflineSubmission.create({ ...values, outcome: "pending" });
  } catch (error) {
    if (error instanceof UniqueConstraintError) return null;
    throw error;
  }
}

export async function settleSubmission(
  id: number,
  values: Partial<Pick<OfflineSubmission, "outcome" | "message" | "changes" | "payload" | "liftRecordId">>,
  transaction?: Transaction,
) {
  await OfflineSubmission.update(values, { where: { id }, transaction });
}

/** Gives the id back when the work could not be done at all (a fault, or input to put right), so it may come again. */
export async function releaseSubmission(id: number) {
  await OfflineSubmission.destroy({ where: { id, outcome: "pending" } });
}

/** What arrived from phones for a plan, newest first: for the plan's page. */
export async function listPlanSubmissions(organisationId: number, planId: number) {
  return OfflineSubmission.findAll({
    where: { organisationId, planId, kind: "lift" },
    order: [["receivedAt", "DESC"]],
  });
}
