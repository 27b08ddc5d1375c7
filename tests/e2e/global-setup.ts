// One served build with the demo scenario for all browser tests; they read its address with inject("baseUrl").
import type { TestProject } from "vitest/node";
import { startBuiltServer, type BuiltServer } from "../support/built-server";

declare module "vitest" {
  export interface ProvidedContext {
    baseUrl: string;
    databasePath: string;
  }
}

let server: BuiltServer | undefined;

export async function setup(project: TestProject) {
  server = await startBuiltServer();
  project.provide("baseUrl", server.baseUrl);
  project.provide("databasePath", server.databasePath);
}

export async function teardown() {
  await server?.stop();
}
