// The connection layer of app/utils/db.server.ts: Sequelize's per-SELECT `PRAGMA table_info` is answered from a
// cache that a schema change clears, so reads stay right after a migration and cost one statement otherwise.
import { DataTypes, Model, type Sequelize } from "sequelize";
import type sqlite3 from "sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sequelize } from "~/utils/db.server";

class Probe extends Model {
  declare id: number;
  declare name: string;
  declare checkedAt: Date | null;
}

/** Runs `work` and returns the SQL statements SQLite was given on the shared (non-transaction) connection. */
async function statementsDuring(db: Sequelize, work: () => Promise<unknown>): Promise<string[]> {
  const connection = (await (
    db.connectionManager as unknown as { getConnection(o: object): Promise<sqlite3.Database> }
  ).getConnection({})) as sqlite3.Database;
  const seen: string[] = [];
  const listen = (sql: string) => seen.push(sql);
  connection.on("trace", listen);
  try {
    await work();
    // Trace events arrive on a later turn of the loop than the results.
    await new Promise((r) => setTimeout(r, 20));
  } finally {
    connection.removeListener("trace", listen);
  }
  return seen;
}

// SQLite only: the cache answers its `PRAGMA table_info`; PostgreSQL takes column types from each result.
const ON_SQLITE = sequelize.getDialect() === "sqlite";

beforeAll(async () => {
  if (!ON_SQLITE) return;
  await sequelize.getQueryInterface().createTable("probe_items", {
    id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
    name: { type: DataTypes.STRING, allowNull: false },
  });
  Probe.init(
    { id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true }, name: DataTypes.STRING },
    { sequelize, tableName: "probe_items", timestamps: false },
  );
  await Probe.create({ name: "first" });
});
afterAll(async () => {
  if (!ON_SQLITE) return;
  await sequelize.getQueryInterface().dropTable("probe_items");
});

describe.skipIf(!ON_SQLITE)("column declarations Sequelize asks for", () => {
  it("are asked of SQLite once, then answered from the cache", async () => {
    await Probe.findAll();
    const statements = await statementsDuring(sequelize, () => Probe.findAll());
    expect(statements.filter((s) => s.startsWith("SELECT"))).toHaveLength(1);
    expect(statements.filter((s) => /PRAGMA table_info/i.test(s))).toEqual([]);
  });

  it("are asked again after a schema change, so a column a migration adds is read with its type", async () => {
    await Probe.findAll();
    await sequelize
      .getQueryInterface()
      .addColumn("probe_items", "checked_at", { type: DataTypes.DATE, allowNull: true });
    Probe.init(
      {
        id: { type: DataTypes.INTEGER, primaryKey: true, autoIncrement: true },
        name: DataTypes.STRING,
        checkedAt: { type: DataTypes.DATE, field: "checked_at" },
      },
      { sequelize, tableName: "probe_items", timestamps: false },
    );
    const at = new Date("2026-03-14T10:15:00.000Z");
    await Probe.create({ name: "second", checkedAt: at });
    const statements = await statementsDuring(sequelize, async () => {
      const row = await Probe.findOne({ where: { name: "second" } });
      // Read as a Date only when the column's declared type is known (the cache was cleared by ALTER TABLE).
      expect(row?.checkedAt).toBeInstanceOf(Date);
      expect(row?.checkedAt?.toISOString()).toBe(at.toISOString());
    });
    expect(statements.some((s) => /PRAGMA table_info/i.test(s))).toBe(true);
  });
});
