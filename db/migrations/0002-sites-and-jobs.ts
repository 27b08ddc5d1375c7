import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

export const up: Migration = async ({ context: qi }) => {
  await qi.createTable("sites", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "organisations", key: "id" } },
    name: { type: DataTypes.STRING(200), allowNull: false },
    customer: { type: DataTypes.STRING(200), allowNull: false },
    address: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    site_contact: { type: DataTypes.STRING(200), allowNull: false, defaultValue: "" },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("sites", ["organisation_id", "name"]);
  await qi.createTable("jobs", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "organisations", key: "id" } },
    site_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "sites", key: "id" } },
    work_order: { type: DataTypes.STRING(60), allowNull: false },
    title: { type: DataTypes.STRING(200), allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    status: { type: DataTypes.STRING(10), allowNull: false, defaultValue: "open" },
    starts_on: { type: DataTypes.DATEONLY, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("jobs", ["organisation_id", "work_order"], { unique: true });
  await qi.addIndex("jobs", ["site_id"]);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("jobs");
  await qi.dropTable("sites");
};
