import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

const REVISION_COLUMNS = {
  submitted_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: "users", key: "id" } },
  submitted_at: { type: DataTypes.DATE, allowNull: true },
  approved_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: "users", key: "id" } },
  approved_at: { type: DataTypes.DATE, allowNull: true },
  approver_name: { type: DataTypes.STRING(200), allowNull: true },
  approval_comment: { type: DataTypes.TEXT, allowNull: true },
  self_approved: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
  fingerprint: { type: DataTypes.STRING(64), allowNull: true },
  verify_token: { type: DataTypes.STRING(64), allowNull: true },
  assigned_rigger_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "users", key: "id" } },
  superseded_by_revision: { type: DataTypes.INTEGER, allowNull: true },
  closed_reason: { type: DataTypes.TEXT, allowNull: true },
  closed_at: { type: DataTypes.DATE, allowNull: true },
} as const;

/** Review, approval and the lift itself: who submitted and approved each revision, acknowledgements, comments and lift records. */
export const up: Migration = async ({ context: qi }) => {
  for (const [name, spec] of Object.entries(REVISION_COLUMNS)) await qi.addColumn("plan_revisions", name, spec);
  await qi.addIndex("plan_revisions", ["verify_token"], { unique: true });
  await qi.addIndex("plan_revisions", ["status"]);
  await qi.createTable("plan_acknowledgements", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revision_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "plan_revisions", key: "id" },
      onDelete: "CASCADE",
    },
    check_id: { type: DataTypes.STRING(80), allowNull: false },
    check_item: { type: DataTypes.STRING(300), allowNull: false },
    check_message: { type: DataTypes.TEXT, allowNull: false },
    reason: { type: DataTypes.TEXT, allowNull: false },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" } },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("plan_acknowledgements", ["revision_id", "check_id"], { unique: true });
  await qi.createTable("plan_comments", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revision_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "plan_revisions", key: "id" },
      onDelete: "CASCADE",
    },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" } },
    kind: { type: DataTypes.STRING(20), allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("plan_comments", ["revision_id"]);
  await qi.createTable("lift_records", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revision_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      unique: true,
      references: { model: "plan_revisions", key: "id" },
    },
    checklist: { type: DataTypes.TEXT, allowNull: false },
    lifted_at: { type: DataTypes.DATE, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    near_miss: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    near_miss_details: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    recorded_by: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" } },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.createTable("lift_record_photos", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    lift_record_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "lift_records", key: "id" },
      onDelete: "CASCADE",
    },
    stored_file_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "stored_files", key: "id" } },
  });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("lift_record_photos");
  await qi.dropTable("lift_records");
  await qi.dropTable("plan_comments");
  await qi.dropTable("plan_acknowledgements");
  await qi.removeIndex("plan_revisions", ["status"]);
  await qi.removeIndex("plan_revisions", ["verify_token"]);
  for (const name of Object.keys(REVISION_COLUMNS).reverse()) await qi.removeColumn("plan_revisions", name);
};
