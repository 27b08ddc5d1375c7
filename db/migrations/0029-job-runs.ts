import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/**
 * Scheduled work done at most once per organisation and period, however many servers start it: a run claims its
 * (job, organisation, period) row first, and the unique index refuses a second claim, so a second run, on this server
 * or another, does nothing.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.createTable("job_runs", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    job: { type: DataTypes.STRING(40), allowNull: false },
    organisation_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "organisations", key: "id" },
      onDelete: "CASCADE",
    },
    period: { type: DataTypes.STRING(20), allowNull: false },
    claimed_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("job_runs", ["job", "organisation_id", "period"], { unique: true, name: "job_runs_once" });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("job_runs");
};
