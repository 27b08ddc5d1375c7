// Runs before each test file: a fresh SQLite file, migrated by the project's own migrations, and an empty upload
// folder; both are removed when the file's tests are done.
import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll } from "vitest";

const file = path.join(os.tmpdir(), `plumbline-test-${process.pid}-${randomUUID()}.sqlite`);
process.env.DATABASE_PATH = file;
const uploadDir = path.join(os.tmpdir(), `plumbline-uploads-${randomUUID()}`);
process.env.UPLOAD_DIR = uploadDir;
globalThis.__plumblineSequelize = undefined;
globalThis.__plumblineMail = undefined;

const { sequelize } = await import("~/utils/db.server");
const { createMigrator } = await import("../../db/umzug");
await createMigrator(sequelize).up();

afterAll(async () => {
  await sequelize.close();
  for (const suffix of ["", "-wal", "-shm"]) fs.rmSync(file + suffix, { force: true });
  fs.rmSync(uploadDir, { recursive: true, force: true });
});
