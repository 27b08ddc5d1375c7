import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

export const up: Migration = async ({ context: qi }) => {
  await qi.createTable("plans", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "organisations", key: "id" } },
    job_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "jobs", key: "id" } },
    title: { type: DataTypes.STRING(200), allowNull: false },
    created_by: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" } },
    // Set right after the first revision is written; points at the revision the plan shows.
    current_revision_id: { type: DataTypes.INTEGER, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("plans", ["organisation_id", "job_id"]);
  await qi.createTable("plan_revisions", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    plan_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "plans", key: "id" },
      onDelete: "CASCADE",
    },
    revision: { type: DataTypes.INTEGER, allowNull: false },
    // draft, in_review, returned, approved, superseded, completed, cancelled
    status: { type: DataTypes.STRING(20), allowNull: false, defaultValue: "draft" },
    // Optimistic lock: every save is UPDATE ... WHERE version = the version the editor loaded.
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    component_id: {
      type: DataTypes.INTEGER,
      allowNull: true,
      references: { model: "components", key: "id" },
      onDelete: "SET NULL",
    },
    component_version: { type: DataTypes.INTEGER, allowNull: true },
    // JSON documents: the load (a ComponentDefinition), the arrangement, the gear allocation,
    // the server-computed results and the lift's sequence, hazards and people.
    load_snapshot: { type: DataTypes.TEXT, allowNull: false },
    arrangement: { type: DataTypes.TEXT, allowNull: false },
    rigging: { type: DataTypes.TEXT, allowNull: false },
    crane_item_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "gear_items", key: "id" } },
    results: { type: DataTypes.TEXT, allowNull: false },
    details: { type: DataTypes.TEXT, allowNull: false },
    planned_by: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" } },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("plan_revisions", ["plan_id", "revision"], { unique: true });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("plan_revisions");
  await qi.dropTable("plans");
};
