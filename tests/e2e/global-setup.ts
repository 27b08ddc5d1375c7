// Serves the built app (as `npm run demo` does) on a free loopback port over a fresh database
// seeded with the demo scenario; the browser tests read its address with inject("baseUrl").
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import type { TestProject } from "vitest/node";

declare module "vitest" {
  export interface ProvidedContext {
    baseUrl: string;
    databasePath: string;
  }
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.listen(0, "127.0.0.1", () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
    server.on("error", reject);
  });
}

let server: ChildProcess | undefined;
let workDir: string | undefined;

export async function setup(project: TestProject) {
  if (!fs.existsSync("build/server/index.js")) throw new Error("Build the app first (npm run build); the browser tests drive the build.");
  workDir = fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-e2e-"));
  const env = {
    ...process.env,
    NODE_ENV: "production",
    PLUMBLINE_ENV: "demo",
    DATABASE_PATH: path.join(workDir, "plumbline.sqlite"),
    UPLOAD_DIR: path.join(workDir, "uploads"),
    HOST: "127.0.0.1",
  };
  const seeded = spawnSync(process.execPath, ["node_modules/tsx/dist/cli.mjs", "db/cli.ts", "setup"], { env, encoding: "utf8" });
  if (seeded.status !== 0) throw new Error(`db setup failed: ${seeded.stderr}`);
  const port = await freePort();
  server = spawn(process.execPath, ["node_modules/@react-router/serve/bin.js", "build/server/index.js"], {
    env: { ...env, PORT: String(port) },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let output = "";
  server.stdout?.on("data", (d) => (output += d));
  server.stderr?.on("data", (d) => (output += d));
  const baseUrl = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 30_000;
  for (;;) {
    try {
      const res = await fetch(`${baseUrl}/login`);
      if (res.ok) break;
    } catch {
      // not up yet
    }
    if (server.exitCode !== null || Date.now() > deadline) throw new Error(`The app did not start:\n${output}`);
    await new Promise((r) => setTimeout(r, 200));
  }
  project.provide("baseUrl", baseUrl);
  project.provide("databasePath", env.DATABASE_PATH);
}

export async function teardown() {
  if (server && server.exitCode === null) {
    server.kill("SIGTERM");
    await new Promise((r) => server!.once("exit", r));
  }
  if (workDir) fs.rmSync(workDir, { recursive: true, force: true });
}
