import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/**
 * The sealed record of an approved revision: everything its page, print and verify page show, stored
 * once as JSON in the approval's transaction (its SHA-256 is the fingerprint), and the gear items it
 * allocates, so a change to an item finds the approved plans that use it without reading their JSON.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.addColumn("plan_revisions", "sealed", { type: DataTypes.TEXT, allowNull: true });
  await qi.createTable("plan_revision_items", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revision_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "plan_revisions", key: "id" },
      onDelete: "CASCADE",
    },
    gear_item_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "gear_items", key: "id" },
      onDelete: "CASCADE",
    },
  });
  await qi.addIndex("plan_revision_items", ["revision_id", "gear_item_id"], { unique: true });
  await qi.addIndex("plan_revision_items", ["gear_item_id"]);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("plan_revision_items");
  await qi.removeColumn("plan_revisions", "sealed");
};
