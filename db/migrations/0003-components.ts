import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

export const up: Migration = async ({ context: qi }) => {
  await qi.createTable("components", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "organisations", key: "id" } },
    name: { type: DataTypes.STRING(200), allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    mass_kg: { type: DataTypes.DOUBLE, allowNull: false },
    mass_source: { type: DataTypes.STRING(20), allowNull: false },
    mass_note: { type: DataTypes.STRING(500), allowNull: false, defaultValue: "" },
    contingency_pct: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    length_m: { type: DataTypes.DOUBLE, allowNull: false },
    width_m: { type: DataTypes.DOUBLE, allowNull: false },
    height_m: { type: DataTypes.DOUBLE, allowNull: false },
    cog_x_m: { type: DataTypes.DOUBLE, allowNull: false },
    cog_y_m: { type: DataTypes.DOUBLE, allowNull: false },
    cog_z_m: { type: DataTypes.DOUBLE, allowNull: false },
    cog_source: { type: DataTypes.STRING(20), allowNull: false },
    cog_note: { type: DataTypes.STRING(500), allowNull: false, defaultValue: "" },
    // Polygons as JSON arrays of [a, b] pairs in metres: elevation in (x, z), plan in (x, y).
    outline_elevation: { type: DataTypes.TEXT, allowNull: false },
    outline_plan: { type: DataTypes.TEXT, allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    archived_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("components", ["organisation_id", "archived_at", "name"]);
  await qi.createTable("component_lift_points", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    component_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "components", key: "id" },
      onDelete: "CASCADE",
    },
    position: { type: DataTypes.INTEGER, allowNull: false },
    label: { type: DataTypes.STRING(10), allowNull: false },
    x_m: { type: DataTypes.DOUBLE, allowNull: false },
    y_m: { type: DataTypes.DOUBLE, allowNull: false },
    z_m: { type: DataTypes.DOUBLE, allowNull: false },
    axis_x: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    axis_y: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
    axis_z: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 1 },
    thread: { type: DataTypes.STRING(20), allowNull: false, defaultValue: "" },
    engagement_mm: { type: DataTypes.DOUBLE, allowNull: true },
  });
  await qi.addIndex("component_lift_points", ["component_id", "label"], { unique: true });
  await qi.createTable("component_parts", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    component_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "components", key: "id" },
      onDelete: "CASCADE",
    },
    position: { type: DataTypes.INTEGER, allowNull: false },
    name: { type: DataTypes.STRING(200), allowNull: false },
    mass_kg: { type: DataTypes.DOUBLE, allowNull: false },
    x_m: { type: DataTypes.DOUBLE, allowNull: false },
    y_m: { type: DataTypes.DOUBLE, allowNull: false },
    z_m: { type: DataTypes.DOUBLE, allowNull: false },
  });
  await qi.addIndex("component_parts", ["component_id"]);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("component_parts");
  await qi.dropTable("component_lift_points");
  await qi.dropTable("components");
};
