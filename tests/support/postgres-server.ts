// A throwaway PostgreSQL server for the tests and the benchmark: Debian's postgresql package (installed by
// tests/ensure-tools.sh like Chromium), a cluster made in a temporary folder, listening on a free loopback port,
// tuned for speed over durability (fsync off: its data is thrown away), stopped and deleted by `stop()`.
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import net from "node:net";
import os from "node:os";
import path from "node:path";
import pg from "pg";

export type PostgresServer = {
  /** A URL naming database `name` on this server (the superuser's own `postgres` database by default). */
  url: (name?: string) => string;
  /** Runs one SQL statement as the superuser in the `postgres` database. */
  admin: (sql: string) => Promise<void>;
  stop: () => Promise<void>;
};

const USER = "plumbline";

/** The folder of Debian's PostgreSQL programs (the newest installed major version), or null. */
export function postgresBinaries(): string | null {
  const root = "/usr/lib/postgresql";
  if (!fs.existsSync(root)) return null;
  const versions = fs
    .readdirSync(root)
    .filter((v) => fs.existsSync(path.join(root, v, "bin", "initdb")))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length ? path.join(root, versions[0]!, "bin") : null;
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const probe = net.createServer();
    probe.once("error", reject);
    probe.listen(0, "127.0.0.1", () => {
      const { port } = probe.address() as net.AddressInfo;
      probe.close(() => resolve(port));
    });
  });
}

/** PostgreSQL refuses to run as root: as root, its programs run as Debian's `postgres` user. */
function asServerUser(command: string, args: string[]): [string, string[]] {
  return process.getuid?.() === 0 ? ["runuser", ["-u", "postgres", "--", command, ...args]] : [command, args];
}

async function waitForConnection(url: string, server: ChildProcess, log: () => string) {
  const deadline = Date.now() + 30_000;
  for (;;) {
    if (server.exitCode !== null) throw new Error(`PostgreSQL stopped while starting:\n${log()}`);
    const client = new pg.Client({ connectionString: url });
    try {
      await client.connect();
      await client.end();
      return;
    } catch (error) {
      await client.end().catch(() => undefined);
      if (Date.now() > deadline)
        throw new Error(`PostgreSQL did not accept connections in 30 s: ${String(error)}`, { cause: error });
      await new Promise((r) => setTimeout(r, 100));
    }
  }
}

export async function startPostgres(): Promise<PostgresServer> {
  const bin = postgresBinaries();
  if (!bin)
    throw new Error(
      "PostgreSQL is not installed (Debian: apt-get install postgresql); tests/ensure-tools.sh installs it.",
    );
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-pg-"));
  const data = path.join(folder, "data");
  fs.mkdirSync(data);
  if (process.getuid?.() === 0) spawnSync("chown", ["-R", "postgres:postgres", folder]);
  fs.chmodSync(folder, 0o755);
  const [initdb, initArgs] = asServerUser(path.join(bin, "initdb"), [
    "-D",
    data,
    "-U",
    USER,
    "--auth=trust",
    "-E",
    "UTF8",
    // Unicode case rules (ILIKE, lower) with code-point order, as SQLite compares text.
    "--locale=C.UTF-8",
  ]);
  const made = spawnSync(initdb, initArgs, { encoding: "utf8" });
  if (made.status !== 0) throw new Error(`initdb failed: ${made.stderr || made.stdout}`);

  const port = await freePort();
  const [postgres, serverArgs] = asServerUser(path.join(bin, "postgres"), [
    "-D",
    data,
    "-p",
    String(port),
    "-k",
    folder,
    "-c",
    "listen_addresses=127.0.0.1",
    "-c",
    "fsync=off",
    "-c",
    "synchronous_commit=off",
    "-c",
    "full_page_writes=off",
    "-c",
    "max_connections=300",
  ]);
  let output = "";
  const server = spawn(postgres, serverArgs, { stdio: ["ignore", "pipe", "pipe"] });
  server.stdout?.on("data", (d: Buffer) => (output = (output + d.toString()).slice(-4000)));
  server.stderr?.on("data", (d: Buffer) => (output = (output + d.toString()).slice(-4000)));
  const url = (name = "postgres") => `postgres://${USER}@127.0.0.1:${port}/${name}`;
  const remove = () => fs.rmSync(folder, { recursive: true, force: true });
  try {
    await waitForConnection(url(), server, () => output);
  } catch (error) {
    server.kill("SIGKILL");
    remove();
    throw error;
  }
  return {
    url,
    admin: async (sql) => {
      const client = new pg.Client({ connectionString: url() });
      await client.connect();
      try {
        await client.query(sql);
      } finally {
        await client.end();
      }
    },
    stop: async () => {
      if (server.exitCode === null) {
        const stopped = new Promise((r) => server.once("exit", r));
        // SIGINT: PostgreSQL's fast shutdown (ends sessions, no waiting for clients).
        server.kill("SIGINT");
        await Promise.race([stopped, new Promise((r) => setTimeout(r, 10_000))]);
        if (server.exitCode === null) server.kill("SIGKILL");
      }
      remove();
    },
  };
}
