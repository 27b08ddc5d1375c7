import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

export const up: Migration = async ({ context: qi }) => {
  // Uploaded files of any feature (certificates, staged imports, drawings): the bytes live under
  // UPLOAD_DIR by storage_key, never under public/.
  await qi.createTable("stored_files", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "organisations", key: "id" } },
    storage_key: { type: DataTypes.STRING(80), allowNull: false, unique: true },
    purpose: { type: DataTypes.STRING(30), allowNull: false },
    original_name: { type: DataTypes.STRING(255), allowNull: false },
    content_type: { type: DataTypes.STRING(100), allowNull: false },
    size_bytes: { type: DataTypes.INTEGER, allowNull: false },
    uploaded_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: "users", key: "id" } },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("stored_files", ["organisation_id", "purpose"]);

  await qi.createTable("gear_items", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "organisations", key: "id" } },
    item_code: { type: DataTypes.STRING(40), allowNull: false },
    kind: { type: DataTypes.STRING(20), allowNull: false },
    description: { type: DataTypes.STRING(300), allowNull: false, defaultValue: "" },
    manufacturer: { type: DataTypes.STRING(120), allowNull: false, defaultValue: "" },
    serial: { type: DataTypes.STRING(80), allowNull: false, defaultValue: "" },
    wll_value: { type: DataTypes.DOUBLE, allowNull: false },
    wll_unit: { type: DataTypes.STRING(10), allowNull: false },
    wll_kg: { type: DataTypes.DOUBLE, allowNull: false },
    thread: { type: DataTypes.STRING(20), allowNull: true },
    eyebolt_family: { type: DataTypes.STRING(10), allowNull: true },
    shackle_type: { type: DataTypes.STRING(10), allowNull: true },
    pin_type: { type: DataTypes.STRING(10), allowNull: true },
    chain_grade: { type: DataTypes.INTEGER, allowNull: true },
    diameter_mm: { type: DataTypes.DOUBLE, allowNull: true },
    legs: { type: DataTypes.INTEGER, allowNull: true },
    length_m: { type: DataTypes.DOUBLE, allowNull: true },
    hook_height_m: { type: DataTypes.DOUBLE, allowNull: true },
    beam_mass_kg: { type: DataTypes.DOUBLE, allowNull: true },
    home_site_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "sites", key: "id" } },
    status: { type: DataTypes.STRING(15), allowNull: false, defaultValue: "in_service" },
    status_reason: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    status_changed_by: { type: DataTypes.INTEGER, allowNull: true, references: { model: "users", key: "id" } },
    status_changed_at: { type: DataTypes.DATE, allowNull: true },
    // Copied from the latest examination when one is recorded, so the register can filter and
    // sort 5,000 items by due date without a subquery per row.
    last_examined_on: { type: DataTypes.DATEONLY, allowNull: true },
    next_due_on: { type: DataTypes.DATEONLY, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("gear_items", ["organisation_id", "item_code"], { unique: true });
  await qi.addIndex("gear_items", ["organisation_id", "next_due_on"]);
  await qi.addIndex("gear_items", ["organisation_id", "kind"]);
  await qi.addIndex("gear_items", ["organisation_id", "status"]);
  await qi.addIndex("gear_items", ["home_site_id"]);

  await qi.createTable("examinations", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    organisation_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "organisations", key: "id" } },
    gear_item_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "gear_items", key: "id" } },
    examined_on: { type: DataTypes.DATEONLY, allowNull: false },
    examiner: { type: DataTypes.STRING(200), allowNull: false },
    result: { type: DataTypes.STRING(4), allowNull: false },
    defects: { type: DataTypes.TEXT, allowNull: false, defaultValue: "" },
    next_due_on: { type: DataTypes.DATEONLY, allowNull: false },
    certificate_file_id: { type: DataTypes.INTEGER, allowNull: true, references: { model: "stored_files", key: "id" } },
    recorded_by: { type: DataTypes.INTEGER, allowNull: false, references: { model: "users", key: "id" } },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("examinations", ["gear_item_id", "examined_on"]);
  await qi.addIndex("examinations", ["organisation_id"]);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("examinations");
  await qi.dropTable("gear_items");
  await qi.dropTable("stored_files");
};
