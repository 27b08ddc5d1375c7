// Global setup of the `postgres` test project: one throwaway PostgreSQL server for the run, and a template
// database migrated once by the project's own migrations; each test file copies the template into a database of
// its own (tests/support/database.ts), which takes a fraction of running the migrations again.
import type { TestProject } from "vitest/node";
import { startPostgres, type PostgresServer } from "./postgres-server";

declare module "vitest" {
  export interface ProvidedContext {
    /** The test PostgreSQL server's URL without a database name (set only in the `postgres` project). */
    postgresServerUrl: string;
  }
}

export const TEMPLATE_DATABASE = "plumbline_template";

let server: PostgresServer | undefined;

export async function setup(project: TestProject) {
  server = await startPostgres();
  await server.admin(`CREATE DATABASE ${TEMPLATE_DATABASE}`);
  const { openDatabase } = await import("~/utils/db.server");
  const { createMigrator } = await import("../../db/umzug");
  const template = openDatabase(server.url(TEMPLATE_DATABASE));
  try {
    await createMigrator(template).up();
  } finally {
    await template.close();
  }
  project.provide("postgresServerUrl", server.url(""));
}

export async function teardown() {
  await server?.stop();
}
