// The value conversions of db/copy.ts, on both engines' representations (no database needed).
import { describe, expect, it } from "vitest";
import type { Sequelize } from "sequelize";
import { columnKind, convertFor, normalised } from "./copy-values";

const sqlite = { getDialect: () => "sqlite" } as unknown as Sequelize;
const postgres = { getDialect: () => "postgres" } as unknown as Sequelize;

describe("column kinds", () => {
  it("reads each engine's declared types alike", () => {
    expect(["TINYINT(1)", "BOOLEAN"].map(columnKind)).toEqual(["boolean", "boolean"]);
    expect(["DATETIME", "TIMESTAMP WITH TIME ZONE"].map(columnKind)).toEqual(["time", "time"]);
    expect(["INTEGER", "BIGINT", "DOUBLE PRECISION"].map(columnKind)).toEqual(["number", "number", "number"]);
    expect(["BLOB", "BYTEA"].map(columnKind)).toEqual(["binary", "binary"]);
    // A calendar day stays text ("2026-12-03") on both engines.
    expect(["DATE", "VARCHAR(200)", "CHARACTER VARYING(200)", "TEXT"].map(columnKind)).toEqual([
      "text",
      "text",
      "text",
      "text",
    ]);
  });
});

describe("converting for the target", () => {
  it("turns SQLite's 0/1 and time text into PostgreSQL's boolean and time", () => {
    expect(convertFor(postgres, "boolean", 0, "t.c")).toBe(false);
    expect(convertFor(postgres, "boolean", 1, "t.c")).toBe(true);
    const time = convertFor(postgres, "time", "2026-12-03 14:50:02.123 +00:00", "t.c") as Date;
    expect(time.toISOString()).toBe("2026-12-03T14:50:02.123Z");
  });

  it("turns PostgreSQL's boolean and Date into SQLite's 0/1 and the text Sequelize writes", () => {
    expect(convertFor(sqlite, "boolean", false, "t.c")).toBe(0);
    expect(convertFor(sqlite, "boolean", true, "t.c")).toBe(1);
    expect(convertFor(sqlite, "time", new Date("2026-12-03T14:50:02.123Z"), "t.c")).toBe(
      "2026-12-03 14:50:02.123 +00:00",
    );
  });

  it("keeps nulls, and refuses a value that is not what the column holds, naming where it was", () => {
    expect(convertFor(postgres, "time", null, "t.c")).toBeNull();
    expect(() => convertFor(postgres, "boolean", 2, "users.active")).toThrow(/users\.active holds 2/);
    expect(() => convertFor(postgres, "time", "soon", "plans.created_at")).toThrow(/plans\.created_at .*not a time/);
  });
});

describe("values as the checksum sees them", () => {
  it("are the same whichever engine they were read from", () => {
    expect(normalised("boolean", true, "")).toBe(normalised("boolean", 1, ""));
    expect(normalised("boolean", false, "")).toBe(0);
    expect(normalised("time", "2026-12-03 14:50:02.123 +00:00", "")).toBe(
      normalised("time", new Date("2026-12-03T14:50:02.123Z"), ""),
    );
    expect(normalised("number", "12.5", "")).toBe(12.5);
    expect(normalised("binary", Buffer.from([0, 255]), "")).toBe("base64:AP8=");
    expect(normalised("text", null, "")).toBeNull();
  });

  it("differ when the values differ", () => {
    expect(normalised("time", "2026-12-03 14:50:02.123 +00:00", "")).not.toBe(
      normalised("time", "2026-12-03 14:50:02.124 +00:00", ""),
    );
    expect(normalised("boolean", 0, "")).not.toBe(normalised("boolean", 1, ""));
  });
});
