import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/** Drawings and photos of a component (the bytes are stored files; this links them). */
export const up: Migration = async ({ context: qi }) => {
  await qi.createTable("component_files", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    component_id: {
      type: DataTypes.INTEGER,
      allowNull: false,
      references: { model: "components", key: "id" },
      onDelete: "CASCADE",
    },
    stored_file_id: { type: DataTypes.INTEGER, allowNull: false, references: { model: "stored_files", key: "id" } },
    kind: { type: DataTypes.STRING(10), allowNull: false },
    caption: { type: DataTypes.STRING(200), allowNull: false, defaultValue: "" },
    created_at: { type: DataTypes.DATE, allowNull: false },
  });
  await qi.addIndex("component_files", ["component_id"]);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.dropTable("component_files");
};
