import fs from "node:fs";
import path from "node:path";
import { QueryTypes } from "sequelize";
import { describe, expect, it } from "vitest";
import { sequelize } from "~/utils/db.server";
import { createMigrator, migrations } from "./umzug";

describe("migrations", () => {
  it("lists every file in db/migrations, in name order", () => {
    const files = fs
      .readdirSync(path.join(import.meta.dirname, "migrations"))
      .filter((f) => f.endsWith(".ts") && !f.endsWith(".test.ts"))
      .map((f) => f.replace(/\.ts$/, ""))
      .sort();
    expect(migrations.map(([name]) => name)).toEqual(files);
  });

  it("go down to nothing and up again", async () => {
    const migrator = createMigrator(sequelize);
    await migrator.down({ to: 0 });
    expect(await sequelize.getQueryInterface().showAllTables()).toEqual(["sequelize_meta"]);
    await migrator.up();
    expect(await migrator.pending()).toEqual([]);
    const tables = await sequelize.getQueryInterface().showAllTables();
    expect(tables).toEqual(expect.arrayContaining(["users", "organisations", "jobs", "sites", "audit_events"]));
  });

  it("open connections with foreign keys enforced and WAL journalling", async () => {
    const [fk] = await sequelize.query<{ foreign_keys: number }>("PRAGMA foreign_keys", { type: QueryTypes.SELECT });
    const [journal] = await sequelize.query<{ journal_mode: string }>("PRAGMA journal_mode", {
      type: QueryTypes.SELECT,
    });
    expect(fk?.foreign_keys).toBe(1);
    expect(journal?.journal_mode).toBe("wal");
    await expect(
      sequelize.query(
        "INSERT INTO jobs (organisation_id, site_id, work_order, title, created_at, updated_at) VALUES (999, 999, 'x', 'x', 0, 0)",
      ),
    ).rejects.toThrow(/FOREIGN KEY/);
  });
});
