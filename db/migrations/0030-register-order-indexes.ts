import type { Migration } from "../umzug";

/**
 * The register's sort orders by kind, status and WLL, each ending in the item code (models/gear-item-reads.server.ts),
 * read from an index in that order: a page of the register sorted so reads its fifty rows instead of sorting the
 * whole organisation's register for every page. The due date's order has its own index (migration 0031): a plain
 * column, since Sequelize's SQLite table description, which the data copy and SQLite's column changes rely on,
 * cannot read an index on an expression.
 */
const INDEXES: ReadonlyArray<readonly [name: string, create: string]> = [
  [
    "gear_items_register_kind_order",
    "CREATE INDEX gear_items_register_kind_order ON gear_items (organisation_id, kind, item_code)",
  ],
  [
    "gear_items_register_status_order",
    "CREATE INDEX gear_items_register_status_order ON gear_items (organisation_id, status, item_code)",
  ],
  [
    "gear_items_register_wll_order",
    "CREATE INDEX gear_items_register_wll_order ON gear_items (organisation_id, wll_kg, item_code)",
  ],
];

export const up: Migration = async ({ context: qi }) => {
  for (const [, create] of INDEXES) await qi.sequelize.query(create);
};

export const down: Migration = async ({ context: qi }) => {
  for (const [name] of [...INDEXES].reverse()) await qi.removeIndex("gear_items", name);
};
