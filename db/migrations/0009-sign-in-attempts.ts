import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/** Sign-in and password-reset attempts, kept for the attempt-limiting window (rows older than it are pruned). */
export const up: Migration = async ({ context: qi }) => {
  await qi.createTable("sign_in_attempts", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    scope: { type: DataTypes.STRING(20), allowNull: false },
    account_key: { type: DataTypes.STRING(320), allowNull: true },
    address_key: { type: DataTypes.STRING(64), allowNull: false },
    attempted_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("sign_in_attempts", ["scope", "account_key", "attempted_at"]);
  await qi.addIndex("sign_in_attempts", ["scope", "address_key", "attempted_at"]);
  await qi.addIndex("sign_in_attempts", ["attempted_at"]);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("sign_in_attempts");
};
