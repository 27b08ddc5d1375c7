import fs from "node:fs";
import path from "node:path";
import { Sequelize } from "sequelize";
import sqlite3 from "sqlite3";
import { env } from "~/env.server";

const CONNECTION_PRAGMAS = "PRAGMA journal_mode=WAL; PRAGMA foreign_keys=ON; PRAGMA busy_timeout=10000; PRAGMA synchronous=NORMAL;";

/**
 * Sequelize's sqlite dialect opens a connection per transaction and never runs afterConnect
 * hooks, so every connection is configured here, in the constructor Sequelize calls.
 */
class ConfiguredDatabase extends sqlite3.Database {
  constructor(filename: string, mode?: number, callback?: (err: Error | null) => void) {
    let self: sqlite3.Database | undefined = undefined;
    super(filename, mode ?? sqlite3.OPEN_READWRITE | sqlite3.OPEN_CREATE, (err) => {
      if (err || !self) return callback?.(err);
      self.exec(CONNECTION_PRAGMAS, (pragmaErr) => callback?.(pragmaErr ?? null));
    });
    self = this;
  }
}

const dialectModule = { ...sqlite3, Database: ConfiguredDatabase };

/** Opens (creating its folder if needed) the SQLite file at `storage`. */
export function openDatabase(storage: string): Sequelize {
  if (storage !== ":memory:") fs.mkdirSync(path.dirname(path.resolve(storage)), { recursive: true });
  return new Sequelize({
    dialect: "sqlite",
    dialectModule,
    storage,
    logging: false,
    define: { underscored: true },
    retry: { max: 5, match: [/SQLITE_BUSY/] },
  });
}

declare global {
  var __plumblineSequelize: Sequelize | undefined;
}

/** The application's one connection to its database (kept across dev reloads). */
export const sequelize: Sequelize = (globalThis.__plumblineSequelize ??= openDatabase(env.databasePath));
