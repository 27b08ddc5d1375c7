import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/**
 * Sign-in attempts keyed by where they come from as well as by account: the address (only meaningful behind a
 * trusted proxy) and the browser's device key (set after a successful sign-in), with times in epoch milliseconds
 * for bound comparisons. The rows only live for the attempt window, so the table is made anew rather than copied.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.dropTable("sign_in_attempts");
  await qi.createTable("sign_in_attempts", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    scope: { type: DataTypes.STRING(20), allowNull: false },
    account_key: { type: DataTypes.STRING(320), allowNull: true },
    address_key: { type: DataTypes.STRING(64), allowNull: false },
    device_key: { type: DataTypes.STRING(64), allowNull: true },
    attempted_at_ms: { type: DataTypes.BIGINT, allowNull: false },
  });
  await qi.addIndex("sign_in_attempts", ["scope", "account_key", "attempted_at_ms"]);
  await qi.addIndex("sign_in_attempts", ["scope", "address_key", "attempted_at_ms"]);
  await qi.addIndex("sign_in_attempts", ["attempted_at_ms"]);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("sign_in_attempts");
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
