// Online backup and offline restore of the SQLite file. No Sequelize here: both work on paths, so
// the CLI, the tests and an operator's script can point them at any database.
import fs from "node:fs";
import path from "node:path";
import sqlite3 from "sqlite3";
import { migrations } from "./umzug";

/** The table umzug records applied migrations in (SequelizeStorage "SequelizeMeta", underscored by the `define` option). */
const MIGRATION_TABLE = "sequelize_meta";
const SQLITE_MAGIC = "SQLite format 3\u0000";

/** The parts of node-sqlite3's Backup object used here (its bundled typings leave it out). */
interface SqliteBackup {
  step(pages: number, callback: (err: Error | null) => void): void;
  finish(callback: (err: Error | null) => void): void;
  readonly completed: boolean;
  readonly failed: boolean;
  readonly remaining: number;
  readonly pageCount: number;
  retryErrors: number[];
}
type DatabaseWithBackup = sqlite3.Database & {
  backup(filename: string, callback: (err: Error | null) => void): SqliteBackup;
};

function open(file: string, mode: number): Promise<sqlite3.Database> {
  return new Promise((resolve, reject) => {
    const db: sqlite3.Database = new sqlite3.Database(file, mode, (err) => (err ? reject(err) : resolve(db)));
  });
}

function exec(db: sqlite3.Database, sql: string): Promise<void> {
  return new Promise((resolve, reject) => db.exec(sql, (err) => (err ? reject(err) : resolve())));
}

function all<T>(db: sqlite3.Database, sql: string): Promise<T[]> {
  return new Promise((resolve, reject) => db.all(sql, (err, rows) => (err ? reject(err) : resolve(rows as T[]))));
}

function close(db: sqlite3.Database): Promise<void> {
  return new Promise((resolve, reject) => db.close((err) => (err ? reject(err) : resolve())));
}

function isBusy(error: unknown) {
  return error instanceof Error && /SQLITE_(BUSY|LOCKED)/.test(error.message);
}

function removeSidecars(file: string) {
  for (const suffix of ["-wal", "-shm", "-journal"]) fs.rmSync(file + suffix, { force: true });
}

/** A UTC timestamp that sorts and is safe in a file name: 20260314T102205Z. */
export function fileTimestamp(now = new Date()) {
  return now
    .toISOString()
    .replace(/[-:]/g, "")
    .replace(/\.\d{3}Z$/, "Z");
}

/** Where `db:backup` writes by default: `backups/plumbline-<UTC timestamp>.sqlite` beside the database (data/backups by default). */
export function defaultBackupPath(databasePath: string, now = new Date()) {
  return path.join(path.dirname(path.resolve(databasePath)), "backups", `plumbline-${fileTimestamp(now)}.sqlite`);
}

export type DatabaseCheck = { ok: true; migrations: string[] } | { ok: false; problem: string };

/**
 * Whether `file` is a sound Plumbline database: an SQLite file that passes `PRAGMA integrity_check`
 * and has umzug's migration table with only migrations this code knows. Opens it read-write (a
 * WAL-mode file cannot always be opened read-only), so only call it on a copy or a stopped database.
 */
export async function checkPlumblineDatabase(file: string): Promise<DatabaseCheck> {
  let header: Buffer;
  try {
    const fd = fs.openSync(file, "r");
    header = Buffer.alloc(16);
    fs.readSync(fd, header, 0, 16, 0);
    fs.closeSync(fd);
  } catch {
    return { ok: false, problem: `${file} cannot be read.` };
  }
  if (header.toString("latin1") !== SQLITE_MAGIC) return { ok: false, problem: `${file} is not an SQLite database.` };
  const db = await open(file, sqlite3.OPEN_READWRITE);
  try {
    const integrity = await all<{ integrity_check: string }>(db, "PRAGMA integrity_check");
    const verdict = integrity.map((r) => r.integrity_check);
    if (verdict.length !== 1 || verdict[0] !== "ok") {
      return { ok: false, problem: `${file} fails PRAGMA integrity_check: ${verdict.slice(0, 3).join("; ")}` };
    }
    const tables = await all<{ name: string }>(
      db,
      `SELECT name FROM sqlite_master WHERE type = 'table' AND name = '${MIGRATION_TABLE}'`,
    );
    if (tables.length === 0)
      return {
        ok: false,
        problem: `${file} is an SQLite database but not Plumbline's: it has no ${MIGRATION_TABLE} table.`,
      };
    const applied = (await all<{ name: string }>(db, `SELECT name FROM "${MIGRATION_TABLE}" ORDER BY name`)).map(
      (r) => r.name,
    );
    if (applied.length === 0)
      return { ok: false, problem: `${file} has no migrations applied: it is not a Plumbline database in use.` };
    const known = new Set(migrations.map(([name]) => name));
    const unknown = applied.filter((name) => !known.has(name));
    if (unknown.length > 0) {
      return {
        ok: false,
        problem: `${file} was made by a newer Plumbline (migrations ${unknown.join(", ")} are unknown here): deploy that version, then restore.`,
      };
    }
    return { ok: true, migrations: applied };
  } catch (error) {
    return {
      ok: false,
      problem: `${file} cannot be read as a database: ${error instanceof Error ? error.message : String(error)}`,
    };
  } finally {
    await close(db);
  }
}

export type BackupResult = { file: string; bytes: number; pages: number; migrations: number };

/**
 * Copies the live database at `databasePath` to `target` with SQLite's online backup API, in one
 * step, so the copy is one consistent snapshot while the app keeps reading and writing (WAL). The
 * copy is written beside the target as `.partial`, switched to a single self-contained file
 * (journal_mode DELETE), checked, then renamed: a file named `target` is always a whole backup.
 */
export async function backupDatabase(databasePath: string, target: string): Promise<BackupResult> {
  if (!fs.existsSync(databasePath)) throw new Error(`There is no database at ${databasePath}.`);
  if (fs.existsSync(target))
    throw new Error(`${target} exists already; choose another name (backups are never overwritten).`);
  fs.mkdirSync(path.dirname(path.resolve(target)), { recursive: true });
  const partial = `${target}.partial`;
  fs.rmSync(partial, { force: true });
  removeSidecars(partial);

  // No OPEN_CREATE: a mistyped DATABASE_PATH must not back up a new empty database.
  const source = (await open(databasePath, sqlite3.OPEN_READWRITE)) as DatabaseWithBackup;
  let pages: number;
  try {
    await exec(source, "PRAGMA busy_timeout=10000");
    const backup = await new Promise<SqliteBackup>((resolve, reject) => {
      const b: SqliteBackup = source.backup(partial, (err) => (err ? reject(err) : resolve(b)));
    });
    // Busy and locked are retried by this loop, a bounded number of times, rather than inside the binding.
    backup.retryErrors = [];
    for (let attempt = 1; !backup.completed; attempt++) {
      try {
        await new Promise<void>((resolve, reject) => backup.step(-1, (err) => (err ? reject(err) : resolve())));
      } catch (error) {
        if (!isBusy(error) || attempt >= 20) {
          await new Promise<void>((resolve) => backup.finish(() => resolve()));
          throw error;
        }
        await new Promise((r) => setTimeout(r, 100 * attempt));
      }
    }
    pages = backup.pageCount;
    await new Promise<void>((resolve, reject) => backup.finish((err) => (err ? reject(err) : resolve())));
  } catch (error) {
    fs.rmSync(partial, { force: true });
    removeSidecars(partial);
    throw error;
  } finally {
    await close(source);
  }

  try {
    const copy = await open(partial, sqlite3.OPEN_READWRITE);
    await exec(copy, "PRAGMA journal_mode=DELETE");
    await close(copy);
    removeSidecars(partial);
    const check = await checkPlumblineDatabase(partial);
    if (!check.ok) throw new Error(`The backup did not check out: ${check.problem}`);
    const fd = fs.openSync(partial, "r");
    fs.fsyncSync(fd);
    fs.closeSync(fd);
    fs.renameSync(partial, target);
    return { file: target, bytes: fs.statSync(target).size, pages, migrations: check.migrations.length };
  } catch (error) {
    fs.rmSync(partial, { force: true });
    removeSidecars(partial);
    throw error;
  }
}

/**
 * True when another connection has the database open (the app, `npm run reminders`, a shell):
 * exclusive locking mode cannot take the file while any other WAL connection holds it, even idle.
 * A file SQLite cannot read at all (the corrupt database a restore replaces) counts as not in use. A process
 * that has not opened the database yet (Sequelize connects on the first query) holds nothing and is not seen.
 */
export async function isDatabaseInUse(databasePath: string): Promise<boolean> {
  let db: sqlite3.Database;
  try {
    db = await open(databasePath, sqlite3.OPEN_READWRITE);
  } catch (error) {
    return isBusy(error);
  }
  try {
    await exec(db, "PRAGMA busy_timeout=0; PRAGMA locking_mode=EXCLUSIVE;");
    await all(db, "SELECT count(*) FROM sqlite_master");
    await exec(db, "BEGIN EXCLUSIVE; COMMIT;");
    // Fold anything left in the WAL (say, after a crash) into the file before it is set aside.
    await exec(db, "PRAGMA wal_checkpoint(TRUNCATE)");
    return false;
  } catch (error) {
    return isBusy(error);
  } finally {
    await close(db).catch(() => undefined);
  }
}

export type RestoreResult = {
  restoredFrom: string;
  databasePath: string;
  previousKeptAs: string | null;
  migrations: number;
};

/**
 * Replaces the database at `databasePath` with the backup `backupFile`. The app must be stopped: it
 * refuses while anything has the database open. The backup is copied beside the database first and
 * checked there (integrity, migration table); the current file is kept as
 * `<db>.before-restore-<UTC timestamp>`, and stale -wal/-shm files are removed so SQLite cannot
 * replay the old database's log onto the restored one.
 */
export async function restoreDatabase(
  backupFile: string,
  databasePath: string,
  now = new Date(),
): Promise<RestoreResult> {
  const backupResolved = path.resolve(backupFile);
  const dbResolved = path.resolve(databasePath);
  if (!fs.existsSync(backupResolved)) throw new Error(`There is no backup at ${backupFile}.`);
  if (backupResolved === dbResolved) throw new Error("The backup is the database itself; name a backup file.");
  fs.mkdirSync(path.dirname(dbResolved), { recursive: true });
  const stamp = fileTimestamp(now);

  const staged = `${dbResolved}.restoring-${stamp}`;
  removeSidecars(staged);
  fs.copyFileSync(backupResolved, staged);
  try {
    const check = await checkPlumblineDatabase(staged);
    if (!check.ok) throw new Error(`Not restored: ${check.problem.replaceAll(staged, backupFile)}`);
    removeSidecars(staged);

    let previousKeptAs: string | null = null;
    if (fs.existsSync(dbResolved)) {
      if (await isDatabaseInUse(dbResolved)) {
        throw new Error(
          `Not restored: ${databasePath} is in use. Stop Plumbline (and any \`npm run reminders\` run) first, then restore.`,
        );
      }
      previousKeptAs = `${dbResolved}.before-restore-${stamp}`;
      if (fs.existsSync(previousKeptAs))
        throw new Error(`Not restored: ${previousKeptAs} exists already; try again in a second.`);
      fs.renameSync(dbResolved, previousKeptAs);
      // The checkpoint emptied the log; one left over (an unreadable file was not checkpointed) goes with its file.
      if (fs.existsSync(`${dbResolved}-wal`) && fs.statSync(`${dbResolved}-wal`).size > 0)
        fs.renameSync(`${dbResolved}-wal`, `${previousKeptAs}-wal`);
    }
    removeSidecars(dbResolved);
    const fd = fs.openSync(staged, "r");
    fs.fsyncSync(fd);
    fs.closeSync(fd);
    fs.renameSync(staged, dbResolved);
    return { restoredFrom: backupFile, databasePath, previousKeptAs, migrations: check.migrations.length };
  } finally {
    fs.rmSync(staged, { force: true });
    removeSidecars(staged);
  }
}
