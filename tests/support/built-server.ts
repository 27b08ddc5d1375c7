// Serves the production build (as `npm run demo` does) on a free loopback port over a fresh
// database seeded with the demo scenario (or an existing database, or the PostgreSQL one named by
// DATABASE_URL). Used by the browser tests, the durability tests and the benchmarks.
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";

/** The production build's entry: the server and the database commands, run with plain node as `npm start` does. */
export const SERVER_ENTRY = "build/server/index.js";

export type BuiltServer = {
  baseUrl: string;
  databasePath: string;
  workDir: string;
  /** The server process's pid (for fault tests that kill it). */
  pid: number;
  /** Settles when the server process has exited, however it ended. */
  exited: Promise<void>;
  /** What the server printed so far. */
  output: () => string;
  stop: () => Promise<void>;
};

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

export type StartOptions = {
  extraEnv?: Record<string, string>;
  /** Runs after the database is ready and before the server starts, with the server's environment. */
  prepare?: (env: NodeJS.ProcessEnv) => void;
  /**
   * Serve this existing database instead of a fresh demo one: nothing is seeded, uploads are looked for
   * beside it, and stop() leaves its folder alone (the caller made it, the caller removes it).
   */
  databasePath?: string;
  /**
   * Whether to seed the demo scenario before serving (default: yes, unless databasePath is given). No: serve a
   * database another server already set up, such as a second app server on the PostgreSQL database named by
   * DATABASE_URL in extraEnv.
   */
  seed?: boolean;
  /** How long the server may take to answer its first request (default 30 s; a loaded machine may need more). */
  startSeconds?: number;
};

export async function startBuiltServer(options: StartOptions = {}): Promise<BuiltServer> {
  if (!fs.existsSync(SERVER_ENTRY)) throw new Error("Build the app first (npm run build).");
  const existing = options.databasePath;
  const workDir = existing
    ? path.dirname(path.resolve(existing))
    : fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-served-"));
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: "production",
    PLUMBLINE_ENV: "demo",
    DATABASE_PATH: existing ? path.resolve(existing) : path.join(workDir, "plumbline.sqlite"),
    UPLOAD_DIR: path.join(workDir, "uploads"),
    HOST: "127.0.0.1",
    ...options.extraEnv,
  };
  if (options.seed ?? !existing) {
    const seeded = spawnSync(process.execPath, [SERVER_ENTRY, "setup"], {
      env,
      encoding: "utf8",
    });
    if (seeded.status !== 0) throw new Error(`db setup failed: ${seeded.stderr}`);
  }
  options.prepare?.(env);
  const port = await freePort();
  const child = spawn(process.execPath, [SERVER_ENTRY, "serve"], {
    env: { ...env, PORT: String(port) },
    stdio: ["ignore", "pipe", "pipe"],
  });
  const exited = new Promise<void>((resolve) => child.once("exit", () => resolve()));
  const isRunning = () => child.exitCode === null && child.signalCode === null;
  let output = "";
  child.stdout?.on("data", (d) => (output += d));
  child.stderr?.on("data", (d) => (output += d));
  const baseUrl = `http://127.0.0.1:${port}`;
  const deadline = Date.now() + (options.startSeconds ?? 30) * 1000;
  for (;;) {
    try {
      if ((await fetch(`${baseUrl}/login`)).ok) break;
    } catch {
      // not up yet
    }
    if (!isRunning() || Date.now() > deadline) {
      if (isRunning()) child.kill("SIGKILL");
      throw new Error(`The app did not start:\n${output}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  return {
    baseUrl,
    databasePath: env.DATABASE_PATH!,
    workDir,
    pid: child.pid!,
    exited,
    output: () => output,
    stop: async () => {
      if (isRunning()) {
        child.kill("SIGTERM");
        await exited;
      }
      if (!existing) fs.rmSync(workDir, { recursive: true, force: true });
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
