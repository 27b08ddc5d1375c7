import { AsyncLocalStorage } from "node:async_hooks";
import fs from "node:fs";
import path from "node:path";
import pg from "pg";
import { QueryTypes, Sequelize, Transaction } from "sequelize";
import sqlite3 from "sqlite3";
import { env } from "~/utils/env.server";

const CONNECTION_PRAGMAS =
  "PRAGMA journal_mode=WAL; PRAGMA foreign_keys=ON; PRAGMA busy_timeout=10000; PRAGMA synchronous=NORMAL;";

/** Whether queries skip Sequelize's per-query stack capture (production only: tests and development keep it). */
const SKIP_QUERY_STACKS = process.env.NODE_ENV === "production";

type RowsCallback = (this: sqlite3.Statement, err: Error | null, rows: unknown[]) => void;

const TABLE_INFO = /^PRAGMA table_info\(`([^`]+)`\)$/;
const SCHEMA_CHANGE = /^\s*(?:CREATE|ALTER|DROP)\b/i;

/**
 * Column declarations by table, shared by this process's connections. Sequelize's sqlite dialect asks
 * `PRAGMA table_info` of every table a SELECT names, on every SELECT, to learn how to read dates and
 * booleans: several extra round trips through the one serialised connection per query. The schema
 * changes only by migration, so the answers are kept until a statement here creates, alters or drops.
 * (A migration run by another process is followed by a restart: `npm start` migrates, then serves.)
 */
const tableInfoCache = new Map<string, unknown[]>();

function forgetSchemaOnChange(sql: unknown) {
  if (typeof sql === "string" && SCHEMA_CHANGE.test(sql)) tableInfoCache.clear();
}

/**
 * Sequelize's sqlite dialect opens a connection per transaction and never runs afterConnect
 * hooks, so every connection is configured here, in the constructor Sequelize calls.
 */
class ConfiguredDatabase extends sqlite3.Database {
  constructor(filename: string, mode?: number, callback?: (err: Error | null) => void) {
    // sqlite3 calls the open callback with the database as `this`, after the constructor has returned.
    super(filename, mode ?? sqlite3.OPEN_READWRITE | sqlite3.OPEN_CREATE, function (this: sqlite3.Database, err) {
      if (err) return callback?.(err);
      this.exec(CONNECTION_PRAGMAS, (pragmaErr) => callback?.(pragmaErr ?? null));
    });
  }

  override all(sql: string, ...rest: unknown[]): this {
    const table = rest.length === 1 && typeof rest[0] === "function" ? TABLE_INFO.exec(sql)?.[1] : undefined;
    if (table === undefined) {
      forgetSchemaOnChange(sql);
      return (super.all as (sql: string, ...rest: unknown[]) => this)(sql, ...rest);
    }
    const callback = rest[0] as RowsCallback;
    const cached = tableInfoCache.get(table);
    if (cached) {
      process.nextTick(() => callback.call(undefined as unknown as sqlite3.Statement, null, cached));
      return this;
    }
    return super.all(sql, function (this: sqlite3.Statement, err: Error | null, rows: unknown[]) {
      // An empty answer is a table not made yet: ask again next time.
      if (!err && rows.length > 0) tableInfoCache.set(table, rows);
      callback.call(this, err, rows);
    });
  }

  override run(sql: string, ...rest: unknown[]): this {
    forgetSchemaOnChange(sql);
    return (super.run as (sql: string, ...rest: unknown[]) => this)(sql, ...rest);
  }

  /**
   * Sequelize's sqlite dialect makes an Error and formats its stack trace for every query, before it runs, only to
   * give a failed query's error the caller's stack: a large part of a short query's cost. In production the stack is
   * not captured (a failed query's error then carries its message without the caller's frames).
   */
  override serialize(callback?: () => void): void {
    if (!callback || !SKIP_QUERY_STACKS) return super.serialize(callback);
    return super.serialize(() => {
      const limit = Error.stackTraceLimit;
      Error.stackTraceLimit = 0;
      try {
        callback();
      } finally {
        Error.stackTraceLimit = limit;
      }
    });
  }

  override exec(sql: string, callback?: (this: sqlite3.Statement, err: Error | null) => void): this {
    forgetSchemaOnChange(sql);
    return super.exec(sql, callback);
  }
}

const dialectModule = { ...sqlite3, Database: ConfiguredDatabase };

const WRITE_QUERY_TYPES = new Set<string>([
  QueryTypes.INSERT,
  QueryTypes.UPDATE,
  QueryTypes.BULKUPDATE,
  QueryTypes.DELETE,
  QueryTypes.BULKDELETE,
  QueryTypes.UPSERT,
]);

/**
 * One writer at a time in this process. SQLite has one write lock, and a connection waiting for it
 * sleeps in the busy handler on one of libuv's four threads: a few waiters starve the holder of the
 * thread its next statement needs, and they all time out with SQLITE_BUSY. Queued here, writers
 * wait in JavaScript instead; work started inside a queued transaction runs at once (no self-deadlock).
 */
function serialiseWrites(db: Sequelize) {
  const inside = new AsyncLocalStorage<true>();
  let tail: Promise<unknown> = Promise.resolve();
  const queued = <T>(work: () => Promise<T>): Promise<T> => {
    if (inside.getStore()) return work();
    const run = tail.then(() => inside.run(true, work));
    tail = run.catch(() => undefined);
    return run;
  };
  const transaction = db.transaction.bind(db) as (...args: unknown[]) => Promise<unknown>;
  db.transaction = ((...args: unknown[]) =>
    args.some((a) => typeof a === "function")
      ? queued(() => transaction(...args))
      : transaction(...args)) as typeof db.transaction;
  const query = db.query.bind(db) as (...args: unknown[]) => Promise<unknown>;
  db.query = ((sql: unknown, options?: { transaction?: unknown; type?: string }) =>
    !options?.transaction && options?.type && WRITE_QUERY_TYPES.has(options.type)
      ? queued(() => query(sql, options))
      : query(sql, options)) as typeof db.query;
  return db;
}

/** Whether `target` names a PostgreSQL server (a postgres:// URL) rather than an SQLite file. */
export function isPostgresUrl(target: string) {
  return /^postgres(ql)?:\/\//.test(target);
}

/** Opens (creating its folder if needed) the SQLite file at `storage`. */
function openSqlite(storage: string): Sequelize {
  if (storage !== ":memory:") fs.mkdirSync(path.dirname(path.resolve(storage)), { recursive: true });
  return serialiseWrites(
    new Sequelize({
      dialect: "sqlite",
      dialectModule,
      storage,
      logging: false,
      define: { underscored: true },
      // IMMEDIATE takes the write lock at BEGIN: a transaction that reads and then writes cannot find its
      // snapshot stale at the first write (SQLITE_BUSY_SNAPSHOT, which no busy timeout cures).
      transactionType: Transaction.TYPES.IMMEDIATE,
      retry: { max: 5, match: [/SQLITE_BUSY/] },
    }),
  );
}

// COUNT(*) and BIGINT columns (times in ms) come back from PostgreSQL as int8, which pg hands over as strings to
// keep their precision; every int8 here is a count or a millisecond time, far inside a double's exact range.
pg.types.setTypeParser(pg.types.builtins.INT8, (value: string) => Number(value));

/**
 * Connects to the PostgreSQL database at `url`. The server's own locking serves the app (no write queue, no
 * pragmas); a pool per process, so several app servers share the database.
 */
function openPostgres(url: string): Sequelize {
  return new Sequelize(url, {
    dialect: "postgres",
    dialectModule: pg,
    logging: false,
    define: { underscored: true },
    pool: { max: Number(process.env.DATABASE_POOL_MAX) || 10, min: 0, idle: 10_000, acquire: 30_000 },
  });
}

/** Opens the database at `target`: a postgres:// URL, or the path of an SQLite file. */
export function openDatabase(target: string): Sequelize {
  return isPostgresUrl(target) ? openPostgres(target) : openSqlite(target);
}

declare global {
  var __plumblineSequelize: Sequelize | undefined;
}

/** The application's one connection to its database (kept across dev reloads). */
export const sequelize: Sequelize = (globalThis.__plumblineSequelize ??= openDatabase(env.database));
