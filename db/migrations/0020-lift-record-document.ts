import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/**
 * The lift record as a document: who ticked each pre-lift check and when, who released each hold
 * point and when, the gear confirmed on the hook, the people present and the site's time zone, as
 * one JSON document beside the record's own columns. Records made before have none.
 */
export const up: Migration = async ({ context: qi }) => {
  await qi.addColumn("lift_records", "document", { type: DataTypes.TEXT, allowNull: true });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.removeColumn("lift_records", "document");
};
