import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/** Each gear item's own mass, kg (null until recorded): the crane carries it with the load. */
export const up: Migration = async ({ context: qi }) => {
  await qi.addColumn("gear_items", "mass_kg", { type: DataTypes.DOUBLE, allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.removeColumn("gear_items", "mass_kg");
};
