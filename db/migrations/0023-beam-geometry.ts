import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/**
 * A beam's geometry in the register: where its drops hang and where it hangs from, each as metres
 * along the beam from its end A ("0.25, 2.75"). Beams recorded before have neither until edited.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.addColumn("gear_items", "drop_lugs_m", { type: DataTypes.STRING(200), allowNull: true });
  await qi.addColumn("gear_items", "top_lugs_m", { type: DataTypes.STRING(200), allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.removeColumn("gear_items", "top_lugs_m");
  await qi.removeColumn("gear_items", "drop_lugs_m");
};
