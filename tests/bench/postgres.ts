// The plan page and the mixed load on PostgreSQL beside SQLite, on the same data in the same run: the benchmark's
// shaped SQLite database (pages.ts: load-seed.ts, then shape-seed.ts) is copied row for row into a throwaway
// PostgreSQL database (shape-seed.ts writes SQLite's own SQL, so it cannot seed PostgreSQL itself), both are
// served by the production build at once, and each figure is taken on one, then at once on the other, so both see
// the same machine load. Measured as pages.ts measures: one connection for the plan page against /api/ping, then
// the mixed pages at 10 and 50 connections. A benchmark: it prints, it never fails a build.
import { spawnSync } from "node:child_process";
import os from "node:os";
import pg from "pg";
import sqlite3 from "sqlite3";
import { SERVER_ENTRY, signInCookie, startBuiltServer, type BuiltServer } from "../support/built-server";
import { postgresBinaries, startPostgres, type PostgresServer } from "../support/postgres-server";
import {
  cachedDatabase,
  cannon,
  cannonAsync,
  seedShaped,
  SIZES,
  type CannonRequest,
  type CannonResult,
  type Mode,
} from "./pages";
import type { BenchResult } from "./statics";

/** The table the migrator keeps its record in: `migrate` fills it on PostgreSQL, so it is not copied. */
const MIGRATION_TABLE = "SequelizeMeta";

function sqliteRows(db: sqlite3.Database, sql: string): Promise<Array<Record<string, unknown>>> {
  return new Promise((resolve, reject) =>
    db.all(sql, (err, rows) => (err ? reject(err) : resolve(rows as Array<Record<string, unknown>>))),
  );
}

/**
 * Makes the schema on the PostgreSQL database at `url` with the build's own migrations, then copies every row of
 * every table both databases have from the SQLite file, keeping ids, and moves each id sequence past the copied
 * rows. Foreign keys are not checked while copying (the rows come from a database that checked them).
 */
export async function copySqliteToPostgres(sqlitePath: string, url: string) {
  const migrated = spawnSync(process.execPath, [SERVER_ENTRY, "migrate"], {
    env: { ...process.env, NODE_ENV: "production", PLUMBLINE_ENV: "demo", DATABASE_URL: url },
    encoding: "utf8",
  });
  if (migrated.status !== 0) throw new Error(`migrating PostgreSQL failed: ${migrated.stderr}`);
  const source = new sqlite3.Database(sqlitePath, sqlite3.OPEN_READONLY);
  const target = new pg.Client({ connectionString: url });
  await target.connect();
  let rowCount = 0;
  try {
    const { rows: tables } = await target.query<{ name: string }>(
      `SELECT table_name AS name FROM information_schema.tables
        WHERE table_schema = 'public' AND table_type = 'BASE TABLE' AND table_name <> $1 ORDER BY table_name`,
      [MIGRATION_TABLE],
    );
    const quote = (name: string) => `"${name.replaceAll('"', '""')}"`;
    await target.query("BEGIN");
    await target.query("SET LOCAL session_replication_role = replica");
    // Rows the migrations themselves wrote are replaced by the copied ones.
    await target.query(`TRUNCATE ${tables.map((t) => quote(t.name)).join(", ")}`);
    for (const { name } of tables) {
      const sourceColumns = new Set(
        (await sqliteRows(source, `PRAGMA table_info(${quote(name)})`)).map((c) => String(c.name)),
      );
      if (sourceColumns.size === 0) continue;
      const { rows: targetColumns } = await target.query<{ name: string }>(
        `SELECT column_name AS name FROM information_schema.columns
          WHERE table_schema = 'public' AND table_name = $1 AND is_generated = 'NEVER' ORDER BY ordinal_position`,
        [name],
      );
      const columns = targetColumns.map((c) => c.name).filter((c) => sourceColumns.has(c));
      const rows = await sqliteRows(source, `SELECT ${columns.map(quote).join(", ")} FROM ${quote(name)}`);
      // PostgreSQL takes at most 65,535 parameters in one statement.
      const perStatement = Math.max(1, Math.floor(60_000 / columns.length));
      for (let start = 0; start < rows.length; start += perStatement) {
        const chunk = rows.slice(start, start + perStatement);
        const values: unknown[] = [];
        const tuples = chunk.map((row) => {
          const marks = columns.map((c) => `$${values.push(row[c] ?? null)}`);
          return `(${marks.join(", ")})`;
        });
        await target.query(
          `INSERT INTO ${quote(name)} (${columns.map(quote).join(", ")}) VALUES ${tuples.join(", ")}`,
          values,
        );
      }
      rowCount += rows.length;
      if (columns.includes("id")) {
        const { rows: sequence } = await target.query<{ name: string | null }>(
          "SELECT pg_get_serial_sequence($1, 'id') AS name",
          [quote(name)],
        );
        if (sequence[0]?.name)
          await target.query(`SELECT setval($1, (SELECT COALESCE(MAX(id), 0) + 1 FROM ${quote(name)}), false)`, [
            sequence[0].name,
          ]);
      }
    }
    await target.query("COMMIT");
    await target.query("ANALYZE");
  } catch (error) {
    await target.query("ROLLBACK").catch(() => undefined);
    throw error;
  } finally {
    await target.end();
    await new Promise<void>((resolve) => source.close(() => resolve()));
  }
  return rowCount;
}

type Figures = {
  planP50: number;
  planVsPing: number;
  pingP50: number;
  p95: Record<number, number>;
  answered: Record<number, number>;
  bad: number;
};

type Target = {
  label: string;
  server: BuiltServer;
  planner: string;
  admin: string;
  figures: Figures;
};

/** The pages pages.ts drives together in its mixed load, over the same plans. */
function mixedRequests(
  firstPlanId: number,
  lastPlanId: number,
  busyJob: number,
): { planPage: CannonRequest; mixed: CannonRequest[] } {
  const plans = Array.from({ length: 200 }, (_, i) => firstPlanId + ((i * 7919) % (lastPlanId - firstPlanId + 1)));
  const drafts = plans.filter((id) => (id - firstPlanId) % 6 < 3);
  const planPage = { name: "planner: plan page", path: "/", paths: plans.map((id) => `/plans/${id}`) };
  const mixed: CannonRequest[] = [
    { name: "dashboard", path: "/" },
    planPage,
    { name: "editor route", path: "/", paths: drafts.map((id) => `/plans/${id}/edit`) },
    { name: "jobs", path: "/jobs" },
    { name: "a job's plans", path: `/jobs/${busyJob}` },
    { name: "/api/plans", path: "/api/plans" },
    { name: "components", path: "/components" },
    { name: "history", path: "/", paths: plans.map((id) => `/plans/${id}/history`) },
    { name: "admin: users", path: "/admin" },
    { name: "register", path: "/gear", paths: ["/gear", "/gear?page=7", "/gear?sort=nextDueOn"] },
    { name: "register search", path: "/gear?q=tf-1012" },
  ];
  return { planPage, mixed };
}

function sumBad(runs: CannonResult[]) {
  return runs.reduce((n, r) => n + r.errors, 0);
}

export async function runPostgresBench(mode: Mode): Promise<BenchResult[]> {
  if (!postgresBinaries()) {
    console.log("postgres: PostgreSQL is not installed (tests/ensure-tools.sh installs it); skipped.");
    return [];
  }
  const sizes = SIZES[mode];
  const started = performance.now();
  const database = cachedDatabase(mode, (env) => seedShaped(env, sizes));
  let postgres: PostgresServer | undefined;
  const servers: BuiltServer[] = [];
  try {
    postgres = await startPostgres();
    await postgres.admin("CREATE DATABASE plumbline_bench");
    const url = postgres.url("plumbline_bench");
    const copied = await copySqliteToPostgres(database.databasePath, url);
    const sqliteServer = await startBuiltServer({ databasePath: database.databasePath, startSeconds: 120 });
    servers.push(sqliteServer);
    const postgresServer = await startBuiltServer({
      seed: false,
      extraEnv: { DATABASE_URL: url },
      startSeconds: 120,
    });
    servers.push(postgresServer);
    console.log(
      `postgres (${mode}): ${copied.toLocaleString("en-GB")} rows copied from the SQLite benchmark database; ` +
        `ready in ${((performance.now() - started) / 1000).toFixed(0)} s`,
    );
    const empty = (): Figures => ({ planP50: NaN, planVsPing: NaN, pingP50: NaN, p95: {}, answered: {}, bad: 0 });
    const targets: Target[] = [];
    for (const [label, server] of [
      ["SQLite", sqliteServer],
      ["PostgreSQL", postgresServer],
    ] as const)
      targets.push({
        label,
        server,
        planner: await signInCookie(server.baseUrl, "planner@example.com"),
        admin: await signInCookie(server.baseUrl, "admin@example.com"),
        figures: empty(),
      });
    const { firstPlanId, lastPlanId } = database.seeded;
    const newest = (await (
      await fetch(`${sqliteServer.baseUrl}/api/plans?limit=1`, { headers: { Cookie: targets[0]!.planner } })
    ).json()) as { plans: Array<{ jobId: number }> };
    const { planPage, mixed } = mixedRequests(firstPlanId, lastPlanId, newest.plans[0]!.jobId);
    const ping: CannonRequest = { name: "ping", path: "/api/ping" };

    // Warm each (JIT, caches), then the plan page alone on one connection, between two pings, one database after
    // the other.
    for (const t of targets) {
      cannon(t.server.baseUrl, t.planner, 2, 1, [ping, ...mixed]);
      cannon(t.server.baseUrl, t.admin, 2, 1, mixed);
    }
    for (const t of targets) {
      const base = t.server.baseUrl;
      const pings = [cannon(base, t.planner, 1, sizes.alone, [ping])];
      const plan = cannon(base, t.planner, 1, sizes.alone, [planPage]);
      pings.push(cannon(base, t.planner, 1, sizes.alone, [ping]));
      const pingRps = (pings[0]!.requestsPerSecond + pings[1]!.requestsPerSecond) / 2;
      t.figures.planP50 = plan.p50;
      t.figures.pingP50 = (pings[0]!.p50 + pings[1]!.p50) / 2;
      t.figures.planVsPing = plan.requestsPerSecond / pingRps;
      t.figures.bad += plan.errors + plan.non2xx;
    }
    // Mixed: the planner's and the admin's cookies, half the connections each, as pages.ts runs it.
    for (const connections of [10, 50])
      for (const t of targets) {
        const runs = await Promise.all(
          [t.planner, t.admin].map((cookie) =>
            cannonAsync(t.server.baseUrl, cookie, connections / 2, sizes.mixed, mixed),
          ),
        );
        // A run in which no request finished inside its seconds has no percentiles: shown as NaN, never as 0.
        t.figures.p95[connections] = Math.max(...runs.map((r) => r.p95 ?? Number.NaN));
        t.figures.answered[connections] = runs.reduce((n, r) => n + r.count, 0);
        t.figures.bad += sumBad(runs);
      }

    const [load1, load5] = os.loadavg();
    console.log(
      `postgres: plan page and mixed load, SQLite beside PostgreSQL (load average ${load1!.toFixed(2)}, ` +
        `${load5!.toFixed(2)} over 5 min, ${os.availableParallelism()} cores)`,
    );
    console.log(`  ${"".padEnd(34)}${targets.map((t) => t.label.padStart(12)).join("")}`);
    const row = (name: string, unit: string, pick: (f: Figures) => number, digits = 1) =>
      console.log(
        `  ${name.padEnd(34)}${targets.map((t) => `${pick(t.figures).toFixed(digits)} ${unit}`.trim().padStart(12)).join("")}`,
      );
    row("ping p50", "ms", (f) => f.pingP50);
    row("plan page p50 (1 connection)", "ms", (f) => f.planP50);
    row("plan page vs ping (req/s)", "x", (f) => f.planVsPing, 2);
    row("mixed p95 at 10 connections", "ms", (f) => f.p95[10]!, 0);
    row("mixed p95 at 50 connections", "ms", (f) => f.p95[50]!, 0);
    row(`answered in ${sizes.mixed} s at 10 connections`, "", (f) => f.answered[10]!, 0);
    row(`answered in ${sizes.mixed} s at 50 connections`, "", (f) => f.answered[50]!, 0);
    row("errors", "", (f) => f.bad, 0);
    const pgFigures = targets[1]!.figures;
    const note = (name: string, value: number, unit: string): BenchResult => ({
      name: `PostgreSQL: ${name}`,
      value,
      unit,
      target: Number.NaN,
      ok: true,
    });
    return [
      note("plan page p50", pgFigures.planP50, "ms"),
      note("plan page vs ping", pgFigures.planVsPing, "ratio"),
      note("mixed p95 at 10 connections", pgFigures.p95[10]!, "ms"),
      note("mixed p95 at 50 connections", pgFigures.p95[50]!, "ms"),
    ];
  } finally {
    for (const s of servers) await s.stop();
    await postgres?.stop();
    database.remove();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  await runPostgresBench(process.argv.includes("--full") ? "full" : "quick");
}
