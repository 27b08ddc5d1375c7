// Serves the production build (as `npm run demo` does) on a free loopback port over a fresh
// database seeded with the demo scenario. Used by the browser tests and the benchmark.
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";

export type BuiltServer = { baseUrl: string; databasePath: string; workDir: string; stop: () => Promise<void> };

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.listen(0, "127.0.0.1", () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
    server.on("error", reject);
  });
}

export async function startBuiltServer(options: { extraEnv?: Record<string, string>; prepare?: (env: NodeJS.ProcessEnv) => void } = {}): Promise<BuiltServer> {
  if (!fs.existsSync("build/server/index.js")) throw new Error("Build the app first (npm run build).");
  const workDir = fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-served-"));
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: "production",
    PLUMBLINE_ENV: "demo",
    DATABASE_PATH: path.join(workDir, "plumbline.sqlite"),
    UPLOAD_DIR: path.join(workDir, "uploads"),
    HOST: "127.0.0.1",
    ...options.extraEnv,
  };
  const seeded = spawnSync(process.execPath, ["node_modules/tsx/dist/cli.mjs", "db/cli.ts", "setup"], { env, encoding: "utf8" });
  if (seeded.status !== 0) throw new Error(`db setup failed: ${seeded.stderr}`);
  options.prepare?.(env);
  const port = await freePort();
  const child = spawn(process.execPath, ["node_modules/@react-router/serve/bin.js", "build/server/index.js"], {
    env: { ...env, PORT: String(port) },
    stdio: ["ignore", "pipe", "pipe"],
  });
  let output = "";
  child.stdout?.on("data", (d) => (output += d));
  child.stderr?.on("data", (d) => (output += d));
  const baseUrl = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + 30_000;
  for (;;) {
    try {
      if ((await fetch(`${baseUrl}/login`)).ok) break;
    } catch {
      // not up yet
    }
    if (child.exitCode !== null || Date.now() > deadline) throw new Error(`The app did not start:\n${output}`);
    await new Promise((r) => setTimeout(r, 200));
  }
  return {
    baseUrl,
    databasePath: env.DATABASE_PATH!,
    workDir,
    stop: async () => {
      if (child.exitCode === null) {
        child.kill("SIGTERM");
        await new Promise((r) => child.once("exit", r));
      }
      fs.rmSync(workDir, { recursive: true, force: true });
    },
  };
}

/** Signs in through the real form and returns the session cookie. */
export async function signInCookie(baseUrl: string, email: string, password = "plumbline-demo") {
  const res = await fetch(`${baseUrl}/login`, {
    method: "POST",
    body: new URLSearchParams({ email, password, redirectTo: "/" }),
    headers: { Origin: baseUrl },
    redirect: "manual",
  });
  const cookie = res.headers.get("set-cookie");
  if (res.status !== 303 || !cookie) throw new Error(`sign-in failed for ${email}: ${res.status}`);
  return cookie.split(";")[0]!;
}
