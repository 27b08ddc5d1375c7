import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/**
 * Server-side sessions: the cookie carries a random token, only its SHA-256 is stored, so a session can be ended
 * (sign-out, a password change or reset, an admin) and a copied cookie stops working. Times are epoch milliseconds,
 * compared in SQL with bound numbers on every request.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.createTable("sessions", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    user_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "users", key: "id" },
      onDelete: "CASCADE",
    },
    created_at_ms: { type: DataTypes.BIGINT, allowNull: false },
    last_seen_at_ms: { type: DataTypes.BIGINT, allowNull: false },
    expires_at_ms: { type: DataTypes.BIGINT, allowNull: false },
    address: { type: DataTypes.STRING(64), allowNull: true },
    user_agent: { type: DataTypes.STRING(200), allowNull: true },
  });
  await qi.addIndex("sessions", ["user_id"]);
  await qi.addIndex("sessions", ["expires_at_ms"]);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("sessions");
};
