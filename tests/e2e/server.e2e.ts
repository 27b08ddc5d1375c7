// The production server (app/utils/serve.server.ts, built into build/server/index.js) as `npm start` runs it with
// plain node: the build's files with their headers, page paths never looked up on disk, a worker that dies
// replaced, a misconfigured start refused with its reason, and SIGTERM stopping every process.
import { spawn, spawnSync } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { freePort, SERVER_ENTRY, signInCookie, startBuiltServer, type BuiltServer } from "../support/built-server";

let server: BuiltServer;

beforeAll(async () => {
  server = await startBuiltServer({ extraEnv: { WEB_CONCURRENCY: "2" } });
});
afterAll(async () => {
  await server?.stop();
});

/** The pids of a process's children (the workers of a primary). */
function childrenOf(pid: number): number[] {
  const ps = spawnSync("ps", ["-o", "pid=", "--ppid", String(pid)], { encoding: "utf8" });
  return ps.stdout
    .split("\n")
    .map((l) => Number(l.trim()))
    .filter((n) => Number.isInteger(n) && n > 0);
}

function isAlive(pid: number) {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

async function waitFor<T>(what: string, probe: () => T | Promise<T>, timeoutMs = 20_000): Promise<NonNullable<T>> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`Timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

describe("the build's files", () => {
  it("serves hashed assets as immutable and other build files for an hour, with nosniff", async () => {
    const asset = fs.readdirSync("build/client/assets").find((f) => f.endsWith(".js"))!;
    const js = await fetch(`${server.baseUrl}/assets/${asset}`);
    expect(js.status).toBe(200);
    expect(js.headers.get("content-type")).toMatch(/javascript/);
    expect(js.headers.get("cache-control")).toBe("public, max-age=31536000, immutable");
    expect(js.headers.get("x-content-type-options")).toBe("nosniff");

    const icon = await fetch(`${server.baseUrl}/favicon.svg`);
    expect(icon.status).toBe(200);
    expect(icon.headers.get("content-type")).toMatch(/image\/svg\+xml/);
    expect(icon.headers.get("cache-control")).toBe("public, max-age=3600");
    expect(icon.headers.get("x-content-type-options")).toBe("nosniff");
  });

  it("answers a path the build has no file for from the app, with the app's headers", async () => {
    const res = await fetch(`${server.baseUrl}/no-such-file.svg`);
    expect(res.status).toBe(404);
    expect(res.headers.get("content-type")).toMatch(/text\/html/);
    expect(res.headers.get("content-security-policy")).toContain("frame-ancestors 'none'");
    const missingAsset = await fetch(`${server.baseUrl}/assets/no-such-chunk.js`);
    expect(missingAsset.status).toBe(404);
  });
});

describe("worker processes", () => {
  it("replaces a worker that is killed and keeps answering", async () => {
    const workers = await waitFor("two workers", () => {
      const pids = childrenOf(server.pid);
      return pids.length === 2 ? pids : null;
    });
    const cookie = await signInCookie(server.baseUrl, "planner@example.com");
    process.kill(workers[0]!, "SIGKILL");
    const replaced = await waitFor("a replacement worker", () => {
      const pids = childrenOf(server.pid);
      return pids.length === 2 && !pids.includes(workers[0]!) ? pids : null;
    });
    expect(replaced).toContain(workers[1]);
    // Both workers answer (connections are shared out between them): every request succeeds.
    const answers = await Promise.all(
      Array.from({ length: 20 }, () =>
        fetch(`${server.baseUrl}/api/ping`, { headers: { Cookie: cookie } }).then((r) => r.status),
      ),
    );
    expect(answers).toEqual(Array(20).fill(200));
    expect(server.output()).toContain("starting another");
  });

  it("stops every worker on SIGTERM", async () => {
    const own = await startBuiltServer({ extraEnv: { WEB_CONCURRENCY: "2" } });
    const workers = await waitFor("two workers", () => {
      const pids = childrenOf(own.pid);
      return pids.length === 2 ? pids : null;
    });
    await own.stop();
    await waitFor("the workers to exit", () => workers.every((pid) => !isAlive(pid)));
    expect(workers.some(isAlive)).toBe(false);
  });

  it("refuses to start without the production settings, saying which, and leaves no process behind", async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-misconfigured-"));
    try {
      const port = await freePort();
      const env: NodeJS.ProcessEnv = {
        ...process.env,
        NODE_ENV: "production",
        PORT: String(port),
        HOST: "127.0.0.1",
        DATABASE_PATH: path.join(dir, "db.sqlite"),
        WEB_CONCURRENCY: "2",
      };
      for (const name of ["PLUMBLINE_ENV", "SESSION_SECRET", "SMTP_URL", "PUBLIC_URL"]) delete env[name];
      const child = spawn(process.execPath, [SERVER_ENTRY], {
        env,
        stdio: ["ignore", "pipe", "pipe"],
      });
      let output = "";
      child.stdout.on("data", (d) => (output += d));
      child.stderr.on("data", (d) => (output += d));
      const code = await new Promise<number | null>((resolve) => child.once("exit", (c) => resolve(c)));
      expect(code).not.toBe(0);
      expect(output).toContain("SESSION_SECRET");
      expect(output).toContain("before it could serve");
      expect(childrenOf(child.pid!)).toEqual([]);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});
