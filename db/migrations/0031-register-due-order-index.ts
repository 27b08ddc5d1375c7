import type { Migration } from "../umzug";

/**
 * The register's due-date order, ending in the item code (models/gear-item-reads.server.ts), read from an index in
 * that order, as migration 0030 did for kind, status and WLL. An item never examined has no due date and comes first
 * going up: SQLite puts NULL first in an ascending index; PostgreSQL puts it last unless told, so its index says
 * NULLS FIRST. Both index plain columns, which Sequelize's SQLite table description reads.
 */
const NAME = "gear_items_register_due_order";

export const up: Migration = async ({ context: qi }) => {
  const due = qi.sequelize.getDialect() === "postgres" ? "next_due_on ASC NULLS FIRST" : "next_due_on";
  await qi.sequelize.query(`CREATE INDEX ${NAME} ON gear_items (organisation_id, ${due}, item_code)`);
};

export const down: Migration = async ({ context: qi }) => {
  await qi.removeIndex("gear_items", NAME);
};
