import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/**
 * A component's fit tolerance: the largest tilt (deg) at which it can still be guided onto its spigot or
 * dowels without damaging a seal, and where that figure comes from. Null: none known (the checks then use
 * a common-practice figure and say so).
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.addColumn("components", "fit_tolerance_deg", { type: DataTypes.DOUBLE, allowNull: true });
  await qi.addColumn("components", "fit_tolerance_source", {
    type: DataTypes.STRING(500),
    allowNull: false,
    defaultValue: "",
  });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.removeColumn("components", "fit_tolerance_source");
  await qi.removeColumn("components", "fit_tolerance_deg");
};
