import { Op, type Sequelize } from "sequelize";

/** The databases Plumbline runs on: SQLite (the embedded default) and PostgreSQL. */
export type SqlDialect = "sqlite" | "postgres";

export function sqlDialectOf(db: Sequelize): SqlDialect {
  return db.getDialect() === "postgres" ? "postgres" : "sqlite";
}

/**
 * The one place SQL differs by database: picks the text (or value) for `db`'s dialect. Everything else is written
 * once, in SQL both accept (double-quoted names, TRUE and FALSE, bound $parameters, ON CONFLICT).
 */
export function bySqlDialect<T>(db: Sequelize, choices: Record<SqlDialect, T>): T {
  return choices[sqlDialectOf(db)];
}

/** The case-insensitive LIKE: SQLite's LIKE ignores ASCII case already; PostgreSQL's needs ILIKE. */
export function caseInsensitiveLike(db: Sequelize): symbol {
  return bySqlDialect<symbol>(db, { sqlite: Op.like, postgres: Op.iLike });
}

/**
 * The id of the row a hand-written `INSERT ... RETURNING id` (run as QueryTypes.INSERT) made: Sequelize answers
 * SQLite's insert with the last row id, PostgreSQL's with the returned rows.
 */
export function insertedIdOf(result: unknown): number {
  if (Array.isArray(result)) return Number((result[0] as { id: unknown } | undefined)?.id);
  return Number(result);
}

/**
 * A timestamp column read by a hand-written query, as an ISO 8601 time: PostgreSQL's driver gives a Date, SQLite
 * the text Sequelize stored ("2026-12-03 14:50:02.123 +00:00").
 */
export function isoTimeOf(value: string | Date): string {
  if (value instanceof Date) return value.toISOString();
  return new Date(value.replace(" ", "T").replace(/ ?\+00:00$/, "Z")).toISOString();
}
