import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import sqlite3 from "sqlite3";
import { afterAll, describe, expect, it } from "vitest";
import { sequelize } from "~/utils/db.server";
import { Organisation } from "~/models/organisation.server";
import { backupDatabase, checkPlumblineDatabase, defaultBackupPath, restoreDatabase } from "../../db/backup";

const ROWS_PER_BATCH = 3;
const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-backup-test-"));
const livePath = process.env.DATABASE_PATH!;

afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function query<T>(file: string, sql: string, mode = sqlite3.OPEN_READWRITE): Promise<T[]> {
  return new Promise((resolve, reject) => {
    const db = new sqlite3.Database(file, mode, (openErr) => {
      if (openErr) return reject(openErr);
      db.all(sql, (err, rows) => db.close(() => (err ? reject(err) : resolve(rows as T[]))));
    });
  });
}

/** Writer batches found in a database file: batch number -> rows of it. */
async function batchesIn(file: string) {
  const rows = await query<{ name: string }>(file, "SELECT name FROM organisations WHERE name LIKE 'writer %'");
  const counts = new Map<number, number>();
  for (const { name } of rows) {
    const batch = Number(name.split(" ")[1]);
    counts.set(batch, (counts.get(batch) ?? 0) + 1);
  }
  return counts;
}

/**
 * Commits batches of ROWS_PER_BATCH organisations, one transaction each, until stopped; records when each
 * batch was known to be committed (performance.now() after COMMIT returned).
 */
function startWriter() {
  const committedAt: number[] = [];
  let stopping = false;
  const done = (async () => {
    for (let batch = 0; !stopping; batch++) {
      await sequelize.transaction(async (transaction) => {
        await Organisation.bulkCreate(
          Array.from({ length: ROWS_PER_BATCH }, (_, i) => ({ name: `writer ${batch} ${i}` })),
          { transaction },
        );
      });
      committedAt[batch] = performance.now();
    }
  })();
  return {
    committedAt,
    stop: async () => {
      stopping = true;
      await done;
    },
  };
}

// The SQLite file's own backup and restore (PostgreSQL is backed up with pg_dump, see the README).
describe.skipIf(process.env.DATABASE_URL !== undefined)("database backup and restore", () => {
  it("backs up the live database while a writer commits, and the restored copy has every batch committed before the backup began, none half", async () => {
    // About 20 MB of existing rows, so the copy takes long enough for the writer to commit during it.
    await sequelize.query(
      `WITH RECURSIVE n(i) AS (SELECT 1 UNION ALL SELECT i + 1 FROM n WHERE i < 60000)
       INSERT INTO organisations (name, allow_self_approval, created_at, updated_at)
       SELECT printf('filler %06d %s', i, substr(hex(randomblob(150)), 1, 290)), 0, datetime('now'), datetime('now') FROM n`,
    );
    const writer = startWriter();
    while (writer.committedAt.length < 20) await new Promise((r) => setTimeout(r, 5));

    const target = path.join(dir, "during-writes.sqlite");
    const backupStarted = performance.now();
    const committedBefore = writer.committedAt.length;
    const result = await backupDatabase(livePath, target);
    const backupEnded = performance.now();
    await new Promise((r) => setTimeout(r, 50));
    await writer.stop();

    const committedDuring = writer.committedAt.filter((t) => t > backupStarted && t < backupEnded).length;
    expect(committedDuring, "the writer committed while the backup ran").toBeGreaterThan(0);
    expect(result.file).toBe(target);
    expect(fs.existsSync(`${target}.partial`)).toBe(false);

    const restoredPath = path.join(dir, "fresh", "restored.sqlite");
    const restored = await restoreDatabase(target, restoredPath);
    expect(restored.previousKeptAs).toBeNull();
    expect(await checkPlumblineDatabase(restoredPath)).toMatchObject({ ok: true });

    const batches = await batchesIn(restoredPath);
    // One consistent snapshot: batches 0..k-1 whole, nothing after, k at least what was committed before the backup began.
    const present = [...batches.keys()].sort((a, b) => a - b);
    expect(present.length).toBeGreaterThanOrEqual(committedBefore);
    expect(present).toEqual(present.map((_, i) => i));
    for (const [batch, count] of batches) expect(count, `batch ${batch}`).toBe(ROWS_PER_BATCH);
    expect(present.length, "later commits are not in the snapshot").toBeLessThan(writer.committedAt.length);
    const [fillers] = await query<{ count: number }>(
      restoredPath,
      "SELECT count(*) AS count FROM organisations WHERE name LIKE 'filler %'",
    );
    expect(fillers?.count).toBe(60000);

    // After the writer stops, a second backup restored over the first copy has every committed row.
    const final = path.join(dir, "after-writes.sqlite");
    await backupDatabase(livePath, final);
    fs.writeFileSync(`${restoredPath}-wal`, "stale log of the file being replaced");
    fs.writeFileSync(`${restoredPath}-shm`, "stale index");
    const again = await restoreDatabase(final, restoredPath);
    expect(again.previousKeptAs).toMatch(/restored\.sqlite\.before-restore-\d{8}T\d{6}Z$/);
    expect((await batchesIn(again.previousKeptAs!)).size).toBe(present.length);
    expect(fs.existsSync(`${restoredPath}-shm`)).toBe(false);
    const everything = await batchesIn(restoredPath);
    expect(everything.size).toBe(writer.committedAt.length);
    for (let batch = 0; batch < writer.committedAt.length; batch++)
      expect(everything.get(batch), `batch ${batch}`).toBe(ROWS_PER_BATCH);
  });

  it("refuses to restore while the database is open, and restores once it is closed", async () => {
    const backup = path.join(dir, `open-${randomUUID()}.sqlite`);
    await backupDatabase(livePath, backup);
    const dbPath = path.join(dir, `open-target-${randomUUID()}.sqlite`);
    await restoreDatabase(backup, dbPath);
    const holder = await new Promise<sqlite3.Database>((resolve, reject) => {
      const db = new sqlite3.Database(dbPath, (err) => (err ? reject(err) : resolve(db)));
    });
    await new Promise<void>((resolve, reject) =>
      holder.exec("PRAGMA journal_mode=WAL; SELECT count(*) FROM organisations;", (err) =>
        err ? reject(err) : resolve(),
      ),
    );
    await expect(restoreDatabase(backup, dbPath)).rejects.toThrow(/is in use. Stop Plumbline/);
    expect(
      fs.readdirSync(dir).filter((f) => f.startsWith(path.basename(dbPath)) && f.includes("before-restore")),
    ).toEqual([]);
    await new Promise<void>((resolve) => holder.close(() => resolve()));
    await expect(restoreDatabase(backup, dbPath)).resolves.toMatchObject({
      previousKeptAs: expect.stringContaining("before-restore"),
    });
  });

  it("refuses files that are not a sound Plumbline database and leaves the current one alone", async () => {
    const dbPath = path.join(dir, `current-${randomUUID()}.sqlite`);
    await backupDatabase(livePath, dbPath);
    const before = fs.readFileSync(dbPath);

    const text = path.join(dir, "notes.txt");
    fs.writeFileSync(text, "not a database at all, just some words that are long enough");
    const foreign = path.join(dir, "foreign.sqlite");
    await query(foreign, "CREATE TABLE things (id INTEGER PRIMARY KEY)", sqlite3.OPEN_READWRITE | sqlite3.OPEN_CREATE);
    const corrupt = path.join(dir, "corrupt.sqlite");
    const bytes = Buffer.from(before);
    // Scribble over a few pages past the schema: the header still says SQLite, the b-trees do not hold together.
    for (let page = 3; page < Math.min(40, bytes.length / 4096); page += 3)
      bytes.fill(0x5a, page * 4096 + 8, page * 4096 + 600);
    fs.writeFileSync(corrupt, bytes);

    await expect(restoreDatabase(text, dbPath)).rejects.toThrow(/is not an SQLite database/);
    await expect(restoreDatabase(foreign, dbPath)).rejects.toThrow(/not Plumbline's: it has no sequelize_meta table/);
    await expect(restoreDatabase(corrupt, dbPath)).rejects.toThrow(
      /integrity_check|cannot be read as a database|malformed/,
    );
    await expect(restoreDatabase(path.join(dir, "missing.sqlite"), dbPath)).rejects.toThrow(/There is no backup/);
    expect(fs.readFileSync(dbPath).equals(before)).toBe(true);
    expect(
      fs
        .readdirSync(dir)
        .filter(
          (f) => f.includes("restoring") || (f.startsWith(path.basename(dbPath)) && f.includes("before-restore")),
        ),
    ).toEqual([]);
  });

  it("restores over a database that is no longer readable, keeping it aside", async () => {
    const backup = path.join(dir, `good-${randomUUID()}.sqlite`);
    await backupDatabase(livePath, backup);
    const dbPath = path.join(dir, `broken-${randomUUID()}.sqlite`);
    fs.writeFileSync(dbPath, Buffer.alloc(8192, 0x42));
    fs.writeFileSync(`${dbPath}-wal`, "not a log SQLite could replay");
    const done = await restoreDatabase(backup, dbPath);
    expect(fs.readFileSync(done.previousKeptAs!).equals(Buffer.alloc(8192, 0x42))).toBe(true);
    expect(fs.existsSync(`${dbPath}-wal`)).toBe(false);
    expect(await checkPlumblineDatabase(dbPath)).toMatchObject({ ok: true });
  });

  it("names default backups by UTC time beside the database and never overwrites one", async () => {
    expect(defaultBackupPath("data/plumbline.sqlite", new Date("2026-03-14T10:22:05.123Z"))).toBe(
      path.resolve("data/backups/plumbline-20260314T102205Z.sqlite"),
    );
    const target = path.join(dir, `once-${randomUUID()}.sqlite`);
    await backupDatabase(livePath, target);
    await expect(backupDatabase(livePath, target)).rejects.toThrow(/exists already/);
    await expect(backupDatabase(path.join(dir, "no-such.sqlite"), path.join(dir, "x.sqlite"))).rejects.toThrow(
      /There is no database/,
    );
  });
});
