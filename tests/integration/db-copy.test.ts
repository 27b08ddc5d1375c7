// Copying a whole database between SQLite and PostgreSQL (db/copy.ts, `npm run db:copy -- <from> <to>`): the demo
// scenario plus rows with awkward values goes from an SQLite file into an empty PostgreSQL database and back into a
// new SQLite file; each side's rows must read back equal, row for row and through the app's own models.
// Needs the test PostgreSQL server: runs in the `postgres` project, skipped in `unit`.
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { QueryTypes, type Sequelize } from "sequelize";
import { afterAll, beforeAll, describe, expect, inject, it, vi } from "vitest";
import { openDatabase } from "~/utils/db.server";
import { compareDatabases, copyDatabase, copyReport, CopyRefused, FILLED_BY_MIGRATIONS } from "../../db/copy";
import { createMigrator } from "../../db/umzug";

const serverUrl = inject("postgresServerUrl");
const folder = path.join(os.tmpdir(), `plumbline-copy-${randomUUID()}`);
const madeDatabases: string[] = [];
const opened: Sequelize[] = [];

async function admin(sql: string) {
  const client = new pg.Client({ connectionString: `${serverUrl}postgres` });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

/** A new, empty PostgreSQL database on the test server: its URL. */
async function newPostgres() {
  const name = `plumbline_copy_${randomUUID().replaceAll("-", "")}`;
  await admin(`CREATE DATABASE ${name}`);
  madeDatabases.push(name);
  return `${serverUrl}${name}`;
}

/**
 * The app's models and the demo seeders, loaded afresh on the database at `target` (the models bind to the
 * connection db.server.ts holds when they load), with that connection.
 */
async function appOn(target: string) {
  const db = openDatabase(target);
  opened.push(db);
  const kept = globalThis.__plumblineSequelize;
  globalThis.__plumblineSequelize = db;
  vi.resetModules();
  try {
    return {
      db,
      ...(await import("~/models/organisation.server")),
      ...(await import("~/models/user.server")),
      ...(await import("~/models/site.server")),
      ...(await import("~/models/gear-item.server")),
      ...(await import("~/models/gear-item-reads.server")),
      ...(await import("~/models/plan.server")),
      ...(await import("~/models/sealed-print-body.server")),
      ...(await import("../../db/seeders")),
    };
  } finally {
    globalThis.__plumblineSequelize = kept;
  }
}

async function close(db: Sequelize) {
  await db.close();
  opened.splice(opened.indexOf(db), 1);
}

/** Every table's rows, as plain values read through a model, in id order. */
async function plainRows(model: { findAll(o: object): Promise<Array<{ get(o: { plain: true }): unknown }>> }) {
  return (await model.findAll({ order: [["id", "ASC"]] })).map((r) => r.get({ plain: true }));
}

const AWKWARD_TEXT = "Ährenfeld “Nord” O'Neill's \"yard\" — 東京 ✓ 🏗️ back\\slash $1 %_";
const AWKWARD_TIME = new Date("2026-01-02T03:04:05.678Z");
const AWKWARD_BYTES = Buffer.from(Array.from({ length: 256 }, (_, i) => i));
const SEARCH = { q: "renfeld", sort: "itemCode", dir: "asc", page: 1, pageSize: 50 } as const;
const FIRST_PAGE = { cursor: null, towards: "next", limit: 50 } as const;
const TODAY = "2026-12-03";

const source = path.join(folder, "source.sqlite");
let sourceIds: { organisation: number; user: number; site: number; gear: number; body: number };

describe.skipIf(!serverUrl)("copying a database between SQLite and PostgreSQL", () => {
  let postgresCopy: string;
  const sqliteBack = path.join(folder, "back.sqlite");

  beforeAll(async () => {
    fs.mkdirSync(folder, { recursive: true });
    const app = await appOn(source);
    await createMigrator(app.db).up();
    await app.createDemoSeeder(app.db).up();
    const organisation = await app.Organisation.create({ name: AWKWARD_TEXT, allowSelfApproval: true });
    const user = await app.User.create({
      organisationId: organisation.id,
      email: "nobody@example.com",
      name: AWKWARD_TEXT,
      passwordHash: null,
      active: false,
    });
    const site = await app.Site.create({ organisationId: organisation.id, name: AWKWARD_TEXT, customer: "" });
    const template = (await app.GearItem.findOne({ order: [["id", "ASC"]] }))!.get({ plain: true });
    const gear = await app.GearItem.create({
      ...template,
      id: undefined,
      organisationId: organisation.id,
      itemCode: "AWK-1",
      description: AWKWARD_TEXT,
      homeSiteId: null,
      statusChangedAt: AWKWARD_TIME,
      wllValue: 1.25,
    });
    // Enough rows for several batches, and more than one INSERT per batch (gear_items has over 20 columns).
    await app.GearItem.bulkCreate(
      Array.from({ length: 2500 }, (_, i) => ({
        ...template,
        id: undefined,
        itemCode: `BULK-${String(i).padStart(4, "0")}`,
        description: `Bulk round sling ${i}`,
      })),
    );
    const revision = await app.PlanRevision.findOne({ order: [["id", "ASC"]] });
    const body = await app.SealedPrintBody.create({
      revisionId: revision!.id,
      builder: "test",
      bodyKey: "b".repeat(64),
      body: AWKWARD_BYTES,
    });
    sourceIds = { organisation: organisation.id, user: user.id, site: site.id, gear: gear.id, body: body.id };
    await close(app.db);
    postgresCopy = await newPostgres();
  });

  afterAll(async () => {
    for (const db of [...opened]) await close(db);
    for (const name of madeDatabases) await admin(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
    fs.rmSync(folder, { recursive: true, force: true });
  });

  it("a fresh database's migrations fill only the tables the copy replaces", async () => {
    const fresh = openDatabase(path.join(folder, "fresh.sqlite"));
    opened.push(fresh);
    await createMigrator(fresh).up();
    const filled: string[] = [];
    for (const { name } of await fresh.query<{ name: string }>(
      "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE 'gear_items_search%' AND name <> 'sequelize_meta'",
      { type: QueryTypes.SELECT },
    )) {
      const [row] = await fresh.query<{ n: number }>(`SELECT COUNT(*) AS n FROM "${name}"`, {
        type: QueryTypes.SELECT,
      });
      if (row!.n > 0) filled.push(name);
    }
    await close(fresh);
    expect(filled.sort()).toEqual([...FILLED_BY_MIGRATIONS].sort());
  });

  it("copies the SQLite file into an empty PostgreSQL database with every table's rows and checksum the same", async () => {
    const result = await copyDatabase(source, postgresCopy);
    expect(result.differing).toEqual([]);
    expect(copyReport(result).at(-1)).toMatch(/identical/);
    const sqlite = openDatabase(source);
    opened.push(sqlite);
    const tables = await sqlite.query<{ name: string }>(
      "SELECT name FROM sqlite_master WHERE type = 'table' AND name NOT LIKE 'sqlite_%' AND name NOT LIKE 'gear_items_search%' AND name <> 'sequelize_meta'",
      { type: QueryTypes.SELECT },
    );
    await close(sqlite);
    // Every table of the source is covered, and the demo scenario is really there.
    expect(result.tables.map((t) => t.table).sort()).toEqual(tables.map((t) => t.name).sort());
    const rows = Object.fromEntries(result.tables.map((t) => [t.table, t]));
    expect(rows.organisations!.sourceRows).toBe(2);
    expect(rows.gear_items!.sourceRows).toBeGreaterThan(2530);
    expect(rows.sealed_print_bodies!.targetRows).toBe(1);
    for (const t of result.tables) {
      expect(t.targetRows, t.table).toBe(t.sourceRows);
      expect(t.targetChecksum, t.table).toBe(t.sourceChecksum);
    }
    expect(rows.organisations!.sourceChecksum).not.toBe(rows.sites!.sourceChecksum);
    // Paged a few rows at a time (composite and text keys too), each side still lists the same rows.
    const [original, copy] = [openDatabase(source), openDatabase(postgresCopy)];
    opened.push(original, copy);
    const paged = await compareDatabases(original, copy, ["user_roles", "sequelize_data", "organisations"], 3);
    for (const t of paged)
      expect([t.sourceRows, t.targetChecksum], t.table).toEqual([
        rows[t.table]!.sourceRows,
        rows[t.table]!.sourceChecksum,
      ]);
    await close(original);
    await close(copy);
  });

  it("reads back through the app's models: text, nulls, yes/no, times and bytes as they were", async () => {
    const [from, to] = [await appOn(source), await appOn(postgresCopy)];
    for (const name of ["Organisation", "User", "Site", "GearItem", "PlanRevision", "SealedPrintBody"] as const) {
      const [a, b] = [await plainRows(from[name]), await plainRows(to[name])];
      expect(b.length, name).toBeGreaterThan(0);
      expect(b, name).toEqual(a);
    }
    const user = (await to.User.findByPk(sourceIds.user))!;
    expect([user.name, user.passwordHash, user.active]).toEqual([AWKWARD_TEXT, null, false]);
    expect((await to.Organisation.findByPk(sourceIds.organisation))!.allowSelfApproval).toBe(true);
    const gear = (await to.GearItem.findByPk(sourceIds.gear))!;
    expect([gear.description, gear.homeSiteId, gear.wllValue]).toEqual([AWKWARD_TEXT, null, 1.25]);
    expect(gear.statusChangedAt?.toISOString()).toBe(AWKWARD_TIME.toISOString());
    expect(Buffer.from((await to.SealedPrintBody.findByPk(sourceIds.body))!.body).equals(AWKWARD_BYTES)).toBe(true);
    // The search finds the copied item through PostgreSQL's own indexes, as it did through SQLite's.
    const found = await to.searchGearItems(sourceIds.organisation, SEARCH, TODAY, FIRST_PAGE);
    expect(found.rows.map((r) => r.id)).toEqual([sourceIds.gear]);
    expect((await from.searchGearItems(sourceIds.organisation, SEARCH, TODAY, FIRST_PAGE)).rows).toHaveLength(1);
    await close(from.db);
    await close(to.db);
  });

  it("copies PostgreSQL back into a new SQLite file that matches the original file", async () => {
    const progress: string[] = [];
    const result = await copyDatabase(postgresCopy, sqliteBack, { batchRows: 400, progress: (l) => progress.push(l) });
    expect(result.differing).toEqual([]);
    expect(progress).toContain(
      `Copied gear_items: ${result.tables.find((t) => t.table === "gear_items")!.sourceRows} rows.`,
    );
    const [original, back] = [openDatabase(source), openDatabase(sqliteBack)];
    opened.push(original, back);
    const checks = await compareDatabases(original, back);
    expect(checks.filter((c) => !c.same)).toEqual([]);
    expect(checks.length).toBe(result.tables.length);
    await close(original);
    await close(back);
    // SQLite's search index was rebuilt over the copied rows.
    const app = await appOn(sqliteBack);
    expect(
      (await app.searchGearItems(sourceIds.organisation, SEARCH, TODAY, FIRST_PAGE)).rows.map((r) => r.id),
    ).toEqual([sourceIds.gear]);
    await close(app.db);
  });

  it("a changed row shows as a differing table (the comparison can fail)", async () => {
    const [original, copy] = [openDatabase(source), openDatabase(postgresCopy)];
    opened.push(original, copy);
    await copy.query(`UPDATE sites SET notes = notes || '.' WHERE id = ${sourceIds.site}`);
    const checks = await compareDatabases(original, copy, ["sites", "users"]);
    expect(checks.map((c) => [c.table, c.same])).toEqual([
      ["sites", false],
      ["users", true],
    ]);
    await copy.query(`UPDATE sites SET notes = '' WHERE id = ${sourceIds.site}`);
    expect((await compareDatabases(original, copy, ["sites"]))[0]!.same).toBe(true);
    await close(original);
    await close(copy);
  });

  it("new rows in either copy get fresh ids after the copied ones", async () => {
    for (const target of [postgresCopy, sqliteBack]) {
      const app = await appOn(target);
      const [row] = await app.db.query<{ id: number }>("SELECT MAX(id) AS id FROM sites", { type: QueryTypes.SELECT });
      const site = await app.Site.create({ organisationId: sourceIds.organisation, name: "Added after", customer: "" });
      expect(site.id, target).toBe(Number(row!.id) + 1);
      await site.destroy();
      await close(app.db);
    }
  });

  it("refuses a target that holds data, changing nothing", async () => {
    const copy = openDatabase(postgresCopy);
    opened.push(copy);
    const before = await compareDatabases(copy, copy);
    await expect(copyDatabase(source, postgresCopy)).rejects.toThrow(/is not empty: .* hold rows/);
    await expect(copyDatabase(postgresCopy, sqliteBack)).rejects.toThrow(CopyRefused);
    expect(await compareDatabases(copy, copy)).toEqual(before);
    await close(copy);
  });

  it("refuses a source not fully migrated, and a missing source file, leaving the target untouched", async () => {
    const partial = path.join(folder, "partial.sqlite");
    const db = openDatabase(partial);
    opened.push(db);
    await createMigrator(db).up({ to: "0010-indexes" });
    await close(db);
    const target = await newPostgres();
    await expect(copyDatabase(partial, target)).rejects.toThrow(/not fully migrated .*npm run db:migrate/);
    const missing = path.join(folder, "no-such.sqlite");
    await expect(copyDatabase(missing, target)).rejects.toThrow(/There is no SQLite file/);
    expect(fs.existsSync(missing)).toBe(false);
    const empty = openDatabase(target);
    opened.push(empty);
    expect(await empty.getQueryInterface().showAllTables()).toEqual([]);
    await close(empty);
  });

  it("stops on a source table this build does not know, leaving the target without rows, and can then be rerun", async () => {
    const odd = path.join(folder, "odd.sqlite");
    fs.copyFileSync(source, odd);
    const db = openDatabase(odd);
    opened.push(db);
    await db.query("CREATE TABLE site_photos_extra (id INTEGER PRIMARY KEY, note TEXT)");
    await close(db);
    const target = await newPostgres();
    await expect(copyDatabase(odd, target)).rejects.toThrow(/tables this build's schema lacks \(site_photos_extra\)/);
    const again = await copyDatabase(source, target);
    expect(again.differing).toEqual([]);
  });

  it("undoes a copy that fails part way (a name too long for PostgreSQL's column), leaving no rows behind", async () => {
    // SQLite does not hold text to a VARCHAR's length; PostgreSQL refuses the row.
    const long = path.join(folder, "long.sqlite");
    fs.copyFileSync(source, long);
    const db = openDatabase(long);
    opened.push(db);
    await db.query(`UPDATE sites SET name = '${"x".repeat(250)}' WHERE id = ${sourceIds.site}`);
    await close(db);
    const target = await newPostgres();
    await expect(copyDatabase(long, target)).rejects.toThrow(/failed in sites and was undone.*too long/);
    const left = openDatabase(target);
    opened.push(left);
    for (const table of ["organisations", "users", "sites", "gear_items"]) {
      const [row] = await left.query<{ n: number }>(`SELECT COUNT(*) AS n FROM ${table}`, { type: QueryTypes.SELECT });
      expect(row!.n, table).toBe(0);
    }
    await close(left);
    expect((await copyDatabase(source, target)).differing).toEqual([]);
  });
});
