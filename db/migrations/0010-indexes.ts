import type { Migration } from "../umzug";

/**
 * Indexes for the pages a busy organisation opens most, found under load (10,000 plans, 5,000 items):
 * the dashboard queues read the newest revisions of a status (and a rigger's) without visiting the
 * revisions' large JSON columns, and the register counts due items from the index alone.
 */
const INDEXES: Array<[table: string, fields: string[]]> = [
  ["plan_revisions", ["status", "updated_at", "plan_id", "revision"]],
  ["plan_revisions", ["status", "assigned_rigger_id", "updated_at", "plan_id", "revision"]],
  ["gear_items", ["organisation_id", "next_due_on", "status"]],
];

export const up: Migration = async ({ context: qi }) => {
  for (const [table, fields] of INDEXES) await qi.addIndex(table, fields);
};

export const down: Migration = async ({ context: qi }) => {
  for (const [table, fields] of [...INDEXES].reverse()) await qi.removeIndex(table, fields);
};
