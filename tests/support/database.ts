// Runs before each test file: a fresh SQLite file, migrated by the project's own migrations.
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll } from "vitest";

const file = path.join(os.tmpdir(), `plumbline-test-${process.pid}-${randomUUID()}.sqlite`);
process.env.DATABASE_PATH = file;
process.env.UPLOAD_DIR = path.join(os.tmpdir(), `plumbline-uploads-${randomUUID()}`);
globalThis.__plumblineSequelize = undefined;
globalThis.__plumblineMail = undefined;

const { sequelize } = await import("~/utils/db.server");
const { createMigrator } = await import("../../db/umzug");
await createMigrator(sequelize).up();

afterAll(async () => {
  await sequelize.close();
  for (const suffix of ["", "-wal", "-shm"]) fs.rmSync(file + suffix, { force: true });
});
