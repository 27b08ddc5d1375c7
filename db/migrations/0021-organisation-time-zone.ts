import { DataTypes } from "sequelize";
import type { Migration } from "../umzug";

/** The time zone an organisation works in: its "today" for due dates, checks, approval and reminders. */
export const up: Migration = async ({ context: qi }) => {
  await qi.addColumn("organisations", "time_zone", {
    type: DataTypes.STRING(64),
    allowNull: false,
    defaultValue: "Europe/London",
  });
};

export const down: Migration = async ({ context: qi }) => {
  await qi.removeColumn("organisations", "time_zone");
};
