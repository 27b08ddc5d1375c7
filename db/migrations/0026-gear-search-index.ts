import { bySqlDialect } from "~/utils/sql-dialect.server";
import type { Migration } from "../umzug";

/**
 * A full-text index of the register's searched columns (item id, description, manufacturer, serial), so a search of
 * 50,000 items reads the index instead of every row. The trigram tokenizer matches any run of three or more
 * characters anywhere in a column, case-insensitively: the same items the column scan found. It holds no copy of
 * the text (external content: gear_items), and the triggers keep it in step with every insert, update and delete.
 * A migration that rebuilds gear_items (SQLite's ALTER of a column copies the table) must recreate the triggers.
 */
const SQLITE_STATEMENTS = [
  `CREATE VIRTUAL TABLE gear_items_search USING fts5(item_code, description, manufacturer, serial,
     content='gear_items', content_rowid='id', tokenize='trigram')`,
  `CREATE TRIGGER gear_items_search_insert AFTER INSERT ON gear_items BEGIN
     INSERT INTO gear_items_search(rowid, item_code, description, manufacturer, serial)
       VALUES (new.id, new.item_code, new.description, new.manufacturer, new.serial);
   END`,
  `CREATE TRIGGER gear_items_search_delete AFTER DELETE ON gear_items BEGIN
     INSERT INTO gear_items_search(gear_items_search, rowid, item_code, description, manufacturer, serial)
       VALUES ('delete', old.id, old.item_code, old.description, old.manufacturer, old.serial);
   END`,
  `CREATE TRIGGER gear_items_search_update AFTER UPDATE OF item_code, description, manufacturer, serial
     ON gear_items BEGIN
     INSERT INTO gear_items_search(gear_items_search, rowid, item_code, description, manufacturer, serial)
       VALUES ('delete', old.id, old.item_code, old.description, old.manufacturer, old.serial);
     INSERT INTO gear_items_search(rowid, item_code, description, manufacturer, serial)
       VALUES (new.id, new.item_code, new.description, new.manufacturer, new.serial);
   END`,
  `INSERT INTO gear_items_search(gear_items_search) VALUES ('rebuild')`,
];

const SEARCHED_COLUMNS = ["item_code", "description", "manufacturer", "serial"];

/**
 * On PostgreSQL, trigram indexes (the pg_trgm extension, shipped with the server) on each searched column serve the
 * same case-insensitive "contains" search (ILIKE), and PostgreSQL keeps them in step itself.
 */
const POSTGRES_STATEMENTS = [
  "CREATE EXTENSION IF NOT EXISTS pg_trgm",
  ...SEARCHED_COLUMNS.map(
    (column) => `CREATE INDEX gear_items_search_${column} ON gear_items USING gin (${column} gin_trgm_ops)`,
  ),
];

export const up: Migration = async ({ context: qi }) => {
  const statements = bySqlDialect(qi.sequelize, { sqlite: SQLITE_STATEMENTS, postgres: POSTGRES_STATEMENTS });
  for (const sql of statements) await qi.sequelize.query(sql);
};

export const down: Migration = async ({ context: qi }) => {
  if (bySqlDialect(qi.sequelize, { sqlite: false, postgres: true })) {
    for (const column of SEARCHED_COLUMNS) await qi.sequelize.query(`DROP INDEX IF EXISTS gear_items_search_${column}`);
    return;
  }
  for (const name of ["gear_items_search_update", "gear_items_search_delete", "gear_items_search_insert"])
    await qi.sequelize.query(`DROP TRIGGER IF EXISTS ${name}`);
  await qi.sequelize.query("DROP TABLE IF EXISTS gear_items_search");
};
