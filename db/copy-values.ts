// Values crossing between SQLite and PostgreSQL in db/copy.ts: SQLite keeps yes/no as 0/1 and times as text
// ("2026-12-03 14:50:02.123 +00:00", as Sequelize writes them); PostgreSQL has boolean and timestamptz columns.
import type { Sequelize } from "sequelize";
import { sqlDialectOf } from "~/utils/sql-dialect.server";

/** How a column's values are compared and converted between the engines. */
export type ColumnKind = "boolean" | "time" | "number" | "binary" | "text";
export type Column = { name: string; kind: ColumnKind };

/** The kind of a column from its declared type, as either engine describes it. */
export function columnKind(declared: string): ColumnKind {
  const type = declared.toUpperCase();
  if (type === "BOOLEAN" || type === "TINYINT(1)") return "boolean";
  if (type.startsWith("TIMESTAMP") || type.startsWith("DATETIME")) return "time";
  if (/^(INTEGER|INT|BIGINT|SMALLINT|DOUBLE|REAL|FLOAT|NUMERIC|DECIMAL)/.test(type)) return "number";
  if (type === "BLOB" || type === "BYTEA") return "binary";
  return "text";
}

/** A time as read from either engine: a Date (PostgreSQL), or SQLite's text ("2026-12-03 14:50:02.123 +00:00"). */
function timeOf(value: unknown, where: string): Date {
  const time =
    value instanceof Date
      ? value
      : typeof value === "number"
        ? new Date(value)
        : new Date(
            String(value)
              .trim()
              .replace(" ", "T")
              .replace(/ ?([+-]\d\d:?\d\d|Z)$/i, "$1"),
          );
  if (Number.isNaN(time.getTime())) throw new Error(`${where} holds ${JSON.stringify(value)}, which is not a time.`);
  return time;
}

/** `value` (read from either engine) as `target` stores a column of this kind. */
export function convertFor(target: Sequelize, kind: ColumnKind, value: unknown, where: string): unknown {
  if (value === null || value === undefined) return null;
  const postgres = sqlDialectOf(target) === "postgres";
  switch (kind) {
    case "boolean": {
      const truth = value === true || value === 1 || value === "1" || value === "true";
      if (!truth && !(value === false || value === 0 || value === "0" || value === "false"))
        throw new Error(`${where} holds ${JSON.stringify(value)}, which is not a yes/no value.`);
      return postgres ? truth : truth ? 1 : 0;
    }
    case "time": {
      const time = timeOf(value, where);
      return postgres ? time : time.toISOString().replace("T", " ").replace("Z", " +00:00");
    }
    case "number":
      return typeof value === "string" ? Number(value) : value;
    default:
      return value;
  }
}

/** One value as the checksum sees it, whichever engine it came from. */
export function normalised(kind: ColumnKind, value: unknown, where: string): unknown {
  if (value === null || value === undefined) return null;
  switch (kind) {
    case "boolean":
      return value === true || value === 1 || value === "1" || value === "true" ? 1 : 0;
    case "time":
      return timeOf(value, where).toISOString();
    case "number":
      return Number(value);
    case "binary":
      return Buffer.isBuffer(value) ? `base64:${value.toString("base64")}` : `text:${String(value)}`;
    default:
      return value instanceof Date ? value.toISOString() : String(value);
  }
}
