import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/**
 * The printed plan's sealed body, kept: the PDF of a sealed revision without the live band and the printed
 * line (which each print stamps on), built on its first print and reused by every later one. Named by a key
 * over what the body depends on (the fingerprint of the sealed record, the units, the status, the QR code's
 * address) and the builder that made it (a new build's bodies replace an older one's); it goes with its revision.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.createTable("sealed_print_bodies", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    revision_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "plan_revisions", key: "id" },
      onDelete: "CASCADE",
    },
    body_key: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    builder: { type: DataTypes.STRING(64), allowNull: false },
    body: { type: DataTypes.BLOB, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("sealed_print_bodies", ["revision_id"], { name: "sealed_print_bodies_revision" });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("sealed_print_bodies");
};
