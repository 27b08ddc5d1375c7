// Runs before each test file: a fresh database and an empty upload folder, both removed when the file's tests are
// done. In the `unit` project the database is an SQLite file migrated by the project's own migrations; in the
// `postgres` project it is a copy of the migrated template database on the run's PostgreSQL server
// (tests/support/postgres-setup.ts).
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import pg from "pg";
import { afterAll, inject } from "vitest";

const file = path.join(os.tmpdir(), `plumbline-test-${process.pid}-${randomUUID()}.sqlite`);
process.env.DATABASE_PATH = file;
const uploadDir = path.join(os.tmpdir(), `plumbline-uploads-${randomUUID()}`);
process.env.UPLOAD_DIR = uploadDir;
globalThis.__plumblineSequelize = undefined;
globalThis.__plumblineMail = undefined;

const postgresServerUrl = inject("postgresServerUrl");
const postgresDatabase = `plumbline_test_${randomUUID().replaceAll("-", "")}`;

async function postgresAdmin(sql: string) {
  const client = new pg.Client({ connectionString: `${postgresServerUrl}postgres` });
  await client.connect();
  try {
    await client.query(sql);
  } finally {
    await client.end();
  }
}

if (!postgresServerUrl) delete process.env.DATABASE_URL;
else {
  const { TEMPLATE_DATABASE } = await import("./postgres-setup");
  await postgresAdmin(`CREATE DATABASE ${postgresDatabase} TEMPLATE ${TEMPLATE_DATABASE}`);
  process.env.DATABASE_URL = `${postgresServerUrl}${postgresDatabase}`;
}

const { sequelize } = await import("~/utils/db.server");
if (!postgresServerUrl) {
  const { createMigrator } = await import("../../db/umzug");
  await createMigrator(sequelize).up();
}

afterAll(async () => {
  await sequelize.close();
  if (postgresServerUrl) await postgresAdmin(`DROP DATABASE IF EXISTS ${postgresDatabase} WITH (FORCE)`);
  for (const suffix of ["", "-wal", "-shm"]) fs.rmSync(file + suffix, { force: true });
  fs.rmSync(uploadDir, { recursive: true, force: true });
});
