import { createHash } from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { QueryTypes, Transaction, type Sequelize } from "sequelize";
import { SequelizeStorage } from "umzug";
import { isPostgresUrl, openDatabase } from "~/utils/db.server";
import { sqlDialectOf } from "~/utils/sql-dialect.server";
import { createMigrator, migrations } from "./umzug";
import { columnKind, convertFor, normalised, type Column } from "./copy-values";

/** Rows read from the source per query, and the most bound values one INSERT carries (both engines allow more). */
const BATCH_ROWS = 1000;
const MAX_BOUND_VALUES = 20_000;

/**
 * Tables the migrations themselves fill (the published reference rows). A fresh target holds their rows; the copy
 * replaces them with the source's. tests/integration/db-copy.test.ts fails when a migration fills another table.
 */
export const FILLED_BY_MIGRATIONS = ["reference_rows"];

type TableShape = { name: string; columns: Column[]; key: string[] };

export type TableCheck = {
  table: string;
  sourceRows: number;
  targetRows: number;
  sourceChecksum: string;
  targetChecksum: string;
  same: boolean;
};

export type CopyResult = { from: string; to: string; tables: TableCheck[]; differing: string[] };

export type CopyOptions = {
  /** Rows read per query (default 1000). */
  batchRows?: number;
  /** Told of each step as it is done (the command prints them). */
  progress?: (line: string) => void;
};

/** A copy refused before anything was written: the message says why and what to do. */
export class CopyRefused extends Error {}

/** The migrations table and the seeders' record, by the table names Sequelize gives them here. */
function bookkeepingTable(db: Sequelize, modelName: "SequelizeMeta" | "SequelizeData") {
  const model = new SequelizeStorage({ sequelize: db, modelName }).model;
  return { model, table: String(model.getTableName()) };
}

/** SQLite's own tables and the FTS5 search index (rebuilt from gear_items, not copied). */
function isIndexTable(name: string) {
  return name.startsWith("sqlite_") || name.startsWith("gear_items_search");
}

function describe(target: string) {
  if (!isPostgresUrl(target)) return target;
  try {
    const url = new URL(target);
    if (url.password) url.password = "***";
    return url.toString();
  } catch {
    return "the PostgreSQL URL given";
  }
}

/** The first few of `names`, and how many more. */
function someOf(names: string[]) {
  return names.length > 4 ? `${names.slice(0, 4).join(", ")} and ${names.length - 4} more` : names.join(", ");
}

const quote = (name: string) => `"${name.replaceAll('"', '""')}"`;

async function tablesOf(db: Sequelize): Promise<string[]> {
  const names = (await db.getQueryInterface().showAllTables()) as unknown[];
  return names.map((n) => (typeof n === "string" ? n : String((n as { tableName: string }).tableName)));
}

async function countRows(db: Sequelize, table: string, transaction?: Transaction): Promise<number> {
  const [row] = await db.query<{ n: number }>(`SELECT COUNT(*) AS n FROM ${quote(table)}`, {
    type: QueryTypes.SELECT,
    transaction,
  });
  return Number(row?.n ?? 0);
}

async function shapeOf(db: Sequelize, table: string): Promise<TableShape> {
  const described = await db.getQueryInterface().describeTable(table);
  const columns = Object.entries(described).map(([name, c]) => ({ name, kind: columnKind(c.type) }));
  const key = Object.entries(described)
    .filter(([, c]) => c.primaryKey)
    .map(([name]) => name);
  if (!key.length) throw new Error(`Table ${table} has no primary key: the copy cannot page through it.`);
  return { name: table, columns, key };
}

/**
 * The copied tables, parents before the tables whose foreign keys point at them (read from `db`'s schema). A cycle
 * of foreign keys would need deferred checks; the schema has none, and one added later stops the copy here.
 */
async function parentsFirst(db: Sequelize, tables: string[]): Promise<string[]> {
  const parents = new Map<string, Set<string>>();
  for (const table of tables) {
    const references = (await db.getQueryInterface().getForeignKeyReferencesForTable(table)) as Array<{
      referencedTableName?: string;
    }>;
    parents.set(
      table,
      new Set(
        references
          .map((r) => r.referencedTableName)
          .filter((p): p is string => !!p && p !== table && tables.includes(p)),
      ),
    );
  }
  const ordered: string[] = [];
  const placed = new Set<string>();
  while (ordered.length < tables.length) {
    const ready = tables.filter((t) => !placed.has(t) && [...parents.get(t)!].every((p) => placed.has(p)));
    if (!ready.length) {
      const stuck = tables.filter((t) => !placed.has(t));
      throw new Error(`The foreign keys of ${stuck.join(", ")} form a cycle: no order copies parents first.`);
    }
    for (const t of ready) {
      ordered.push(t);
      placed.add(t);
    }
  }
  return ordered;
}

/** Reads `shape`'s rows from `db` in primary-key order, `limit` at a time (keyset paging: memory stays flat). */
async function* batchesOf(db: Sequelize, shape: TableShape, limit: number, transaction?: Transaction) {
  const postgres = sqlDialectOf(db) === "postgres";
  const kinds = new Map(shape.columns.map((c) => [c.name, c.kind]));
  // Text keys in byte order on both engines, so both sides list the rows alike.
  const keyExpr = shape.key.map((k) => (postgres && kinds.get(k) === "text" ? `${quote(k)} COLLATE "C"` : quote(k)));
  const columns = shape.columns.map((c) => quote(c.name)).join(", ");
  const order = keyExpr.join(", ");
  let last: unknown[] | undefined;
  for (;;) {
    const marks = (last ?? []).map((_, i) => `$${i + 1}`);
    const after = !last
      ? ""
      : shape.key.length === 1
        ? `WHERE ${keyExpr[0]} > ${marks[0]}`
        : `WHERE (${keyExpr.join(", ")}) > (${marks.join(", ")})`;
    const rows = await db.query<Record<string, unknown>>(
      `SELECT ${columns} FROM ${quote(shape.name)} ${after} ORDER BY ${order} LIMIT ${limit}`,
      { type: QueryTypes.SELECT, raw: true, bind: last ?? [], transaction },
    );
    if (!rows.length) return;
    yield rows;
    if (rows.length < limit) return;
    const tail = rows[rows.length - 1]!;
    last = shape.key.map((k) => tail[k]);
  }
}

/** Row count and SHA-256 over the rows in primary-key order, each value normalised (see `normalised`). */
async function checksumOf(db: Sequelize, shape: TableShape, batchRows: number) {
  const hash = createHash("sha256");
  let rows = 0;
  for await (const batch of batchesOf(db, shape, batchRows)) {
    for (const row of batch) {
      const values = shape.columns.map((c) => normalised(c.kind, row[c.name], `${shape.name}.${c.name}`));
      hash.update(JSON.stringify(values) + "\n");
      rows++;
    }
  }
  return { rows, checksum: hash.digest("hex") };
}

async function insertRows(target: Sequelize, shape: TableShape, rows: Record<string, unknown>[], tx: Transaction) {
  const perInsert = Math.max(1, Math.floor(MAX_BOUND_VALUES / shape.columns.length));
  const columns = shape.columns.map((c) => quote(c.name)).join(", ");
  for (let start = 0; start < rows.length; start += perInsert) {
    const chunk = rows.slice(start, start + perInsert);
    const bind: unknown[] = [];
    const tuples = chunk.map((row) => {
      const marks = shape.columns.map((c) => {
        bind.push(convertFor(target, c.kind, row[c.name], `${shape.name}.${c.name}`));
        return `$${bind.length}`;
      });
      return `(${marks.join(", ")})`;
    });
    await target.query(`INSERT INTO ${quote(shape.name)} (${columns}) VALUES ${tuples.join(", ")}`, {
      type: QueryTypes.INSERT,
      bind,
      transaction: tx,
    });
  }
}

/** A database error's own words: Sequelize's "Validation error" hides the constraint that failed. */
function failureOf(error: unknown): string {
  const e = error as {
    message?: string;
    errors?: Array<{ message?: string }>;
    parent?: { message?: string; detail?: string };
  };
  const details = [e.parent?.message, e.parent?.detail, ...(e.errors ?? []).map((x) => x.message)].filter(Boolean);
  return [e.message ?? String(error), ...details.filter((d) => d !== e.message)].join("; ");
}

/** The source's applied migrations must be exactly this build's list. */
async function checkSourceMigrations(source: Sequelize, from: string, sourceTables: string[]) {
  const { table } = bookkeepingTable(source, "SequelizeMeta");
  const runThere = isPostgresUrl(from)
    ? `DATABASE_URL=${describe(from)} npm run db:migrate`
    : `DATABASE_PATH=${from} npm run db:migrate`;
  if (!sourceTables.includes(table))
    throw new CopyRefused(`${describe(from)} has no migrations table (${table}): it is not a Plumbline database.`);
  const rows = await source.query<{ name: string }>(`SELECT name FROM ${quote(table)}`, { type: QueryTypes.SELECT });
  const applied = new Set(rows.map((r) => r.name));
  const known = migrations.map(([name]) => name);
  const unknown = [...applied].filter((name) => !known.includes(name));
  if (unknown.length)
    throw new CopyRefused(
      `${describe(from)} has migrations this build does not know (${unknown.join(", ")}): copy it with the Plumbline build that made them.`,
    );
  const pending = known.filter((name) => !applied.has(name));
  if (pending.length)
    throw new CopyRefused(
      `${describe(from)} is not fully migrated (${pending.length} pending, first ${pending[0]}): run \`${runThere}\`, then copy again.`,
    );
}

/**
 * The target must hold no data: no tables at all, or only this build's schema (some or all of its migrations) with
 * every table empty, as a copy that failed and rolled back leaves it.
 */
async function checkTargetEmpty(target: Sequelize, to: string) {
  const { table: meta } = bookkeepingTable(target, "SequelizeMeta");
  const tables = (await tablesOf(target)).filter((t) => !isIndexTable(t));
  if (!tables.length) return;
  const notEmpty = `${describe(to)} is not empty`;
  const advice = "copy into a new, empty database (or a new SQLite file).";
  if (!tables.includes(meta))
    throw new CopyRefused(
      `${notEmpty}: it has tables (${someOf(tables)}) but no Plumbline migrations table; ${advice}`,
    );
  const applied = await target.query<{ name: string }>(`SELECT name FROM ${quote(meta)}`, { type: QueryTypes.SELECT });
  const known = new Set(migrations.map(([name]) => name));
  const foreign = applied.filter((r) => !known.has(r.name)).map((r) => r.name);
  if (foreign.length)
    throw new CopyRefused(`${notEmpty}: it has migrations this build does not know (${foreign.join(", ")}); ${advice}`);
  const withRows: string[] = [];
  for (const table of tables)
    if (table !== meta && !FILLED_BY_MIGRATIONS.includes(table) && (await countRows(target, table)) > 0)
      withRows.push(table);
  if (withRows.length) throw new CopyRefused(`${notEmpty}: ${someOf(withRows)} hold rows; ${advice}`);
}

/**
 * Copies the whole Plumbline database at `from` to `to` (each an SQLite file path or a postgres:// URL): checks the
 * source is fully migrated and the target empty (refusing otherwise, changing nothing), migrates the target, copies
 * every table's rows parents first in one transaction on the target (a failure leaves it empty), rebuilds SQLite's
 * search index or moves PostgreSQL's id sequences past the copied ids, then compares each table on both sides.
 * The app should be stopped while it runs: rows written to the source meanwhile may be missed.
 */
export async function copyDatabase(from: string, to: string, options: CopyOptions = {}): Promise<CopyResult> {
  if (!from || !to)
    throw new CopyRefused("Usage: npm run db:copy -- <from> <to> (each an SQLite file or a postgres:// URL)");
  const same = isPostgresUrl(from) || isPostgresUrl(to) ? from === to : path.resolve(from) === path.resolve(to);
  if (same) throw new CopyRefused("The source and the target are the same database.");
  if (!isPostgresUrl(from) && !fs.existsSync(from)) throw new CopyRefused(`There is no SQLite file at ${from}.`);

  const source = openDatabase(from);
  try {
    const sourceTables = await tablesOf(source);
    await checkSourceMigrations(source, from, sourceTables);
    const target = openDatabase(to);
    try {
      await checkTargetEmpty(target, to);
      return await copyInto(
        { source, sourceTables, target, from, to },
        { batchRows: options.batchRows ?? BATCH_ROWS, progress: options.progress ?? (() => undefined) },
      );
    } finally {
      await target.close();
    }
  } finally {
    await source.close();
  }
}

type Ends = { source: Sequelize; sourceTables: string[]; target: Sequelize; from: string; to: string };

async function copyInto({ source, sourceTables, target, from, to }: Ends, options: Required<CopyOptions>) {
  const { batchRows, progress } = options;
  const applied = await createMigrator(target).up();
  progress(`Target migrated (${applied.length} migrations applied).`);
  const meta = bookkeepingTable(source, "SequelizeMeta").table;
  const seeded = bookkeepingTable(target, "SequelizeData");
  // The record of the demo seeders is not made by a migration: made here when the source has one.
  if (sourceTables.includes(seeded.table)) await seeded.model.sync();

  const targetTables = new Set((await tablesOf(target)).filter((t) => !isIndexTable(t) && t !== meta));
  const copied = sourceTables.filter((t) => !isIndexTable(t) && t !== meta);
  const unknown = copied.filter((t) => !targetTables.has(t));
  if (unknown.length)
    throw new Error(
      `${describe(from)} has tables this build's schema lacks (${unknown.join(", ")}): no rows were copied (the target has this build's empty schema).`,
    );

  const order = await parentsFirst(target, copied);
  const shapes = new Map<string, { source: TableShape; target: TableShape }>();
  for (const table of order) {
    const [s, t] = [await shapeOf(source, table), await shapeOf(target, table)];
    const missing = s.columns.filter((c) => !t.columns.some((tc) => tc.name === c.name)).map((c) => c.name);
    if (missing.length)
      throw new Error(`${table} in ${describe(to)} lacks the source's columns ${missing.join(", ")}.`);
    shapes.set(table, {
      source: s,
      target: { ...t, columns: t.columns.filter((c) => s.columns.some((sc) => sc.name === c.name)) },
    });
  }

  const postgresTarget = sqlDialectOf(target) === "postgres";
  const sourceSnapshot = await source.transaction(
    sqlDialectOf(source) === "postgres"
      ? { isolationLevel: Transaction.ISOLATION_LEVELS.REPEATABLE_READ }
      : { type: Transaction.TYPES.DEFERRED },
  );
  try {
    const tx = await target.transaction();
    let current = "";
    try {
      for (const table of FILLED_BY_MIGRATIONS.filter((t) => shapes.has(t)))
        await target.query(`DELETE FROM ${quote(table)}`, { transaction: tx });
      for (const table of order) {
        const shape = shapes.get(table)!;
        current = table;
        let rows = 0;
        for await (const batch of batchesOf(source, shape.source, batchRows, sourceSnapshot)) {
          await insertRows(target, shape.target, batch, tx);
          rows += batch.length;
        }
        progress(`Copied ${table}: ${rows} row${rows === 1 ? "" : "s"}.`);
      }
      current = "";
      if (postgresTarget) {
        for (const table of order) {
          if (!shapes.get(table)!.target.columns.some((c) => c.name === "id")) continue;
          await target.query(
            `SELECT setval(pg_get_serial_sequence($1, 'id'), COALESCE(MAX(id), 1), MAX(id) IS NOT NULL) FROM ${quote(table)}`,
            { type: QueryTypes.SELECT, bind: [quote(table)], transaction: tx },
          );
        }
      } else {
        await target.query("INSERT INTO gear_items_search(gear_items_search) VALUES ('rebuild')", { transaction: tx });
      }
      await tx.commit();
    } catch (error) {
      await tx.rollback();
      throw new Error(
        `The copy failed${current ? ` in ${current}` : ""} and was undone (the target holds no rows): ${failureOf(error)}`,
        { cause: error },
      );
    }
  } finally {
    await sourceSnapshot.commit();
  }

  progress("Copy committed; comparing every table on both sides.");
  const tables = await compareDatabases(source, target, order, batchRows);
  return {
    from: describe(from),
    to: describe(to),
    tables,
    differing: tables.filter((t) => !t.same).map((t) => t.table),
  };
}

/**
 * Row count and checksum of each of `tables` (by default every table the copy carries) in `source` and in `target`,
 * each side read and normalised on its own: what the copy reports, and a check of any two Plumbline databases.
 */
export async function compareDatabases(
  source: Sequelize,
  target: Sequelize,
  tables?: string[],
  batchRows = BATCH_ROWS,
): Promise<TableCheck[]> {
  const meta = bookkeepingTable(source, "SequelizeMeta").table;
  const names = tables ?? (await tablesOf(source)).filter((t) => !isIndexTable(t) && t !== meta);
  const targetTables = new Set(await tablesOf(target));
  const checks: TableCheck[] = [];
  for (const table of names) {
    const sourceShape = await shapeOf(source, table);
    const s = await checksumOf(source, sourceShape, batchRows);
    let t = { rows: 0, checksum: "(no such table)" };
    if (targetTables.has(table)) {
      const targetShape = await shapeOf(target, table);
      // Compared over the source's columns, each read as its own side declares it.
      const columns = sourceShape.columns.map(
        (c) => targetShape.columns.find((tc) => tc.name === c.name) ?? { name: c.name, kind: c.kind },
      );
      t = await checksumOf(target, { ...targetShape, columns }, batchRows);
    }
    checks.push({
      table,
      sourceRows: s.rows,
      targetRows: t.rows,
      sourceChecksum: s.checksum,
      targetChecksum: t.checksum,
      same: s.rows === t.rows && s.checksum === t.checksum,
    });
  }
  return checks;
}

/** The copy's report: a line per table (rows and checksum on each side), then the verdict. */
export function copyReport(result: CopyResult): string[] {
  const width = Math.max(...result.tables.map((t) => t.table.length), 5);
  const lines = [`Copied ${result.from} to ${result.to}:`];
  for (const t of result.tables) {
    const checksums =
      t.sourceChecksum === t.targetChecksum
        ? `sha256 ${t.sourceChecksum.slice(0, 16)}`
        : `sha256 ${t.sourceChecksum.slice(0, 16)} -> ${t.targetChecksum.slice(0, 16)}`;
    lines.push(
      `  ${t.table.padEnd(width)}  ${String(t.sourceRows).padStart(7)} -> ${String(t.targetRows).padStart(7)} rows  ${checksums}  ${t.same ? "same" : "DIFFERS"}`,
    );
  }
  lines.push(
    result.differing.length
      ? `The copy DIFFERS from the source in ${result.differing.join(", ")}.`
      : `The copy is identical to the source: ${result.tables.length} tables, every row count and checksum the same.`,
  );
  return lines;
}
