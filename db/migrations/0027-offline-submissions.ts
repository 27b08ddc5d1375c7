import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/**
 * Work made on a phone without signal and sent later: one row per piece of work, named by the id the phone gave
 * it, so a piece sent twice is recognised and done once. It keeps when the work was made and when it arrived,
 * what the server decided, what changed in between (JSON) and, for work refused, the work itself (JSON).
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.createTable("offline_submissions", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "organisations", key: "id" },
      onDelete: "CASCADE",
    },
    user_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" } },
    client_id: { type: DataTypes.STRING(64), allowNull: false },
    kind: { type: DataTypes.STRING(12), allowNull: false },
    plan_id: { type: DataTypes.INTEGER, allowNull: true },
    gear_item_id: { type: DataTypes.INTEGER, allowNull: true },
    lift_record_id: { type: DataTypes.INTEGER, allowNull: true },
    made_at: { type: DataTypes.DATE, allowNull: false },
    received_at: { type: DataTypes.DATE, allowNull: false },
    outcome: { type: DataTypes.STRING(12), allowNull: false },
    message: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    changes: { type: DataTypes.TEXT, allowNull: false, defaultValue: "[]" },
    payload: { type: DataTypes.TEXT, allowNull: true },
  });
  await qi.addIndex("offline_submissions", ["organisation_id", "client_id"], {
    unique: true,
    name: "offline_submissions_client_id",
  });
  await qi.addIndex("offline_submissions", ["plan_id"], { name: "offline_submissions_plan" });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("offline_submissions");
};
