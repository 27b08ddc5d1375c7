import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

const timestamps = {
  created_at: { type: DataTypes.DATE, allowNull: false },
  updated_at: { type: DataTypes.DATE, allowNull: false },
};

export const up: Migration = async ({ context: qi }) => {
  await qi.createTable("organisations", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    name: { type: DataTypes.STRING(200), allowNull: false },
    allow_self_approval: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    ...timestamps,
  });
  await qi.createTable("users", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "organisations", key: "id" },
      onDelete: "RESTRICT",
    },
    email: { type: DataTypes.STRING(320), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(200), allowNull: false },
    password_hash: { type: DataTypes.STRING(100), allowNull: true },
    units: { type: DataTypes.STRING(10), allowNull: false, defaultValue: "metric" },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    ...timestamps,
  });
  await qi.addIndex("users", ["organisation_id"]);
  await qi.createTable("user_roles", {
    user_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      primaryKey: true,
      references: { model: "users", key: "id" },
      onDelete: "CASCADE",
    },
    role: { type: DataTypes.STRING(20), allowNull: false, primaryKey: true },
  });
  await qi.createTable("password_tokens", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    user_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "users", key: "id" },
      onDelete: "CASCADE",
    },
    token_hash: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    purpose: { type: DataTypes.STRING(10), allowNull: false },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    used_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.createTable("audit_events", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "organisations", key: "id" } },
    user_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "users", key: "id" } },
    entity: { type: DataTypes.STRING(40), allowNull: false },
    entity_id: { type: DataTypes.INTEGER, allowNull: true },
    action: { type: DataTypes.STRING(60), allowNull: false },
    details: { type: DataTypes.TEXT, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("audit_events", ["organisation_id", "entity", "entity_id"]);
  await qi.createTable("caught_mail", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "organisations", key: "id" } },
    from_address: { type: DataTypes.STRING(400), allowNull: false },
    to_address: { type: DataTypes.STRING(2000), allowNull: false },
    subject: { type: DataTypes.STRING(400), allowNull: false },
    text_body: { type: DataTypes.TEXT, allowNull: false },
    html_body: { type: DataTypes.TEXT, allowNull: true },
    received_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("caught_mail", ["organisation_id", "received_at"]);
};

export const down: Migration = async ({ context: qi }) => {
  for (const table of ["caught_mail", "audit_events", "password_tokens", "user_roles", "users", "organisations"]) {
    await qi.dropTable(table);
  }
};
