// Every role's main pages, the editor route, the printed PDF and the register export, served by the production build
// over a database shaped like a working organisation (load-seed.ts, then shape-seed.ts), driven by autocannon in a
// process of its own (cannon.mjs) with compressed responses. Figures are compared with /api/ping measured in the same
// run, because the machine is shared and absolute times are noise. A benchmark: it prints, it never fails a build.
// Quick by default (under a minute after the build); `--full` for the 10,000-plan, 50,000-item organisation.
import { spawn, spawnSync } from "node:child_process";
import { createHash } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { signInCookie, startBuiltServer } from "../support/built-server";
import { pingsDuring, type Stall } from "./stall";
import type { BenchResult } from "./statics";

export type Mode = "quick" | "full";

const SIZES = {
  quick: { plans: 2_000, gear: 5_000, smallGear: 1_000, alone: 1, mixed: 2 },
  full: { plans: 10_000, gear: 50_000, smallGear: 1_000, alone: 5, mixed: 20 },
} as const;

/** The register search of both organisations: a phrase with more than a page of results in each, so both show 50. */
const REGISTER_SEARCH = "/gear?q=bow+shackle";

export const TARGETS = {
  pageVsPing: 0.5,
  smallVsBigRegister: 1.2,
  p95At50Ms: 100,
  sealedPdfMs: 20,
  /** No request delayed by more than this by an export running beside it. */
  stallMs: 50,
} as const;

/** A stall as a result line: how much the worst ping beside the work exceeded the worst with nothing beside it. */
function delayResult(stall: Stall, target = Number.NaN) {
  return { value: stall.delayMs, unit: "ms", target, ok: Number.isNaN(target) || stall.delayMs <= target };
}

type CannonRequest = {
  name: string;
  method?: "GET" | "POST";
  path: string;
  headers?: Record<string, string>;
  body?: string;
  paths?: string[];
};
type CannonResult = {
  requestsPerSecond: number;
  count: number;
  p50: number;
  p95: number;
  p99: number;
  bytesPerResponse: number;
  errors: number;
  non2xx: number;
  routes: Array<{ name: string; count: number; p50: number; p95: number; statuses: Record<string, number> }>;
};

const GZIP = { "Accept-Encoding": "gzip, deflate, br" };

function cannonArgs(baseUrl: string, cookie: string, connections: number, seconds: number, requests: CannonRequest[]) {
  const input = { url: baseUrl, connections, seconds, headers: { Cookie: cookie, Origin: baseUrl, ...GZIP }, requests };
  return ["tests/bench/cannon.mjs", JSON.stringify(input)];
}

function cannon(baseUrl: string, cookie: string, connections: number, seconds: number, requests: CannonRequest[]) {
  const run = spawnSync(process.execPath, cannonArgs(baseUrl, cookie, connections, seconds, requests), {
    encoding: "utf8",
    maxBuffer: 16 * 1024 * 1024,
  });
  if (run.status !== 0) throw new Error(`autocannon failed: ${run.stderr}`);
  return JSON.parse(run.stdout.trim().split("\n").pop()!) as CannonResult;
}

/** As cannon(), without blocking: for load from several processes at once. */
function cannonAsync(
  baseUrl: string,
  cookie: string,
  connections: number,
  seconds: number,
  requests: CannonRequest[],
): Promise<CannonResult> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, cannonArgs(baseUrl, cookie, connections, seconds, requests));
    let out = "";
    let err = "";
    child.stdout.on("data", (d) => (out += d));
    child.stderr.on("data", (d) => (err += d));
    child.on("close", (code) =>
      code === 0
        ? resolve(JSON.parse(out.trim().split("\n").pop()!) as CannonResult)
        : reject(new Error(`autocannon failed: ${err}`)),
    );
  });
}

/** Resident and peak memory (MB) of each process the server started (its workers). */
function workerMemory(serverPid: number) {
  const children = fs
    .readdirSync("/proc")
    .filter((d) => /^\d+$/.test(d))
    .filter((pid) => {
      try {
        const stat = fs.readFileSync(`/proc/${pid}/stat`, "utf8");
        return Number(stat.slice(stat.lastIndexOf(")") + 2).split(" ")[1]) === serverPid;
      } catch {
        return false;
      }
    });
  const pids = children.length ? children : [String(serverPid)];
  return pids.map((pid) => {
    const status = fs.readFileSync(`/proc/${pid}/status`, "utf8");
    const kb = (field: string) => Number(new RegExp(`${field}:\\s+(\\d+)`).exec(status)?.[1] ?? 0);
    return { pid: Number(pid), rssMb: kb("VmRSS") / 1024, peakMb: kb("VmHWM") / 1024 };
  });
}

/** The register's `n`th page (1 = the first), found by following its Next links as a reader would. */
async function registerPage(base: string, cookie: string, n: number) {
  let path = "/gear";
  for (let i = 1; i < n; i++) {
    const html = await (await fetch(`${base}${path}`, { headers: { Cookie: cookie } })).text();
    const next = /<a href="(\/gear\?after=[^"]+)" rel="next"/.exec(html)?.[1];
    if (!next) throw new Error(`the register has no page ${i + 1}`);
    path = next;
  }
  return path;
}

async function timed(url: string, cookie: string) {
  // A fresh connection each time: a kept-alive one the server has just closed would fail the request.
  const headers = { Cookie: cookie, Connection: "close", ...GZIP };
  const start = performance.now();
  const res = await fetch(url, { headers });
  // fetch undoes the compression: this is the size of the body as sent before it, not of the bytes on the wire.
  const body = new Uint8Array(await res.arrayBuffer());
  return { ms: performance.now() - start, status: res.status, bytes: body.length };
}

/**
 * The shaped database, seeded once per size and schema and kept in the system's temporary folder: each run serves a
 * copy, so only the first run of a mode pays for seeding.
 */
function cachedDatabase(mode: Mode, seed: (env: NodeJS.ProcessEnv) => ReturnType<typeof seedShaped>) {
  const schema = createHash("sha256")
    .update(
      JSON.stringify([
        SIZES[mode].plans,
        SIZES[mode].gear,
        SIZES[mode].smallGear,
        fs.readdirSync("db/migrations").sort(),
      ]),
    )
    .update(fs.readFileSync("tests/bench/load-seed.ts"))
    .update(fs.readFileSync("tests/bench/shape-seed.ts"))
    .digest("hex")
    .slice(0, 12);
  const dir = path.join(os.tmpdir(), `plumbline-bench-${mode}-${schema}`);
  const file = path.join(dir, "plumbline.sqlite");
  const facts = path.join(dir, "seeded.json");
  if (!fs.existsSync(facts)) {
    fs.rmSync(dir, { recursive: true, force: true });
    fs.mkdirSync(dir, { recursive: true });
    const env: NodeJS.ProcessEnv = {
      ...process.env,
      NODE_ENV: "production",
      PLUMBLINE_ENV: "demo",
      DATABASE_PATH: file,
      UPLOAD_DIR: path.join(dir, "uploads"),
    };
    const setup = spawnSync(process.execPath, ["build/server/index.js", "setup"], { env, encoding: "utf8" });
    if (setup.status !== 0) throw new Error(`db setup failed: ${setup.stderr}`);
    const seeded = seed(env);
    spawnSync("sqlite3", [file, "PRAGMA wal_checkpoint(TRUNCATE);"]);
    fs.writeFileSync(facts, JSON.stringify(seeded));
  }
  const work = fs.mkdtempSync(path.join(os.tmpdir(), "plumbline-bench-run-"));
  for (const name of fs.readdirSync(dir))
    if (name.startsWith("plumbline.sqlite")) fs.copyFileSync(path.join(dir, name), path.join(work, name));
  return {
    databasePath: path.join(work, "plumbline.sqlite"),
    seeded: JSON.parse(fs.readFileSync(facts, "utf8")) as ReturnType<typeof seedShaped>,
    remove: () => fs.rmSync(work, { recursive: true, force: true }),
  };
}

function median(values: number[]) {
  return percentile(values, 50);
}

/** The nearest-rank percentile `p` of `values`. */
function percentile(values: number[], p: number) {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1))]!;
}

function seedShaped(env: NodeJS.ProcessEnv, sizes: (typeof SIZES)[Mode]) {
  const tsx = "node_modules/tsx/dist/cli.mjs";
  const load = spawnSync(process.execPath, [tsx, "tests/bench/load-seed.ts", String(sizes.plans), String(sizes.gear)], {
    env,
    encoding: "utf8",
  });
  if (load.status !== 0) throw new Error(`load seeding failed: ${load.stderr}`);
  const range = JSON.parse(load.stdout.trim().split("\n").pop()!) as { firstPlanId: number; lastPlanId: number };
  const shape = spawnSync(
    process.execPath,
    [tsx, "tests/bench/shape-seed.ts", String(range.firstPlanId), String(range.lastPlanId), String(sizes.smallGear)],
    { env, encoding: "utf8" },
  );
  if (shape.status !== 0) throw new Error(`shape seeding failed: ${shape.stderr}`);
  return { ...range, shape: JSON.parse(shape.stdout.trim().split("\n").pop()!) as Record<string, number> };
}

export async function runPagesBench(mode: Mode): Promise<BenchResult[]> {
  const sizes = SIZES[mode];
  const started = performance.now();
  const database = cachedDatabase(mode, (env) => seedShaped(env, sizes));
  const seeded = database.seeded;
  const results: BenchResult[] = [];
  const note = (r: BenchResult) => results.push(r);
  let server: Awaited<ReturnType<typeof startBuiltServer>> | undefined;
  try {
    server = await startBuiltServer({ databasePath: database.databasePath, startSeconds: 120 });
    const { firstPlanId, lastPlanId, shape } = seeded;
    console.log(
      `pages (${mode}): ${(lastPlanId - firstPlanId + 1).toLocaleString("en-GB")} plans over ${shape.jobs} jobs, ` +
        `${shape.revisions} revisions, ${shape.auditRows} audit rows, ${sizes.gear.toLocaleString("en-GB")} + ` +
        `${shape.smallItems} register items; ready in ${((performance.now() - started) / 1000).toFixed(0)} s`,
    );
    const base = server.baseUrl;
    const cookies = {
      planner: await signInCookie(base, "planner@example.com"),
      approver: await signInCookie(base, "approver@example.com"),
      rigger: await signInCookie(base, "rigger@example.com"),
      admin: await signInCookie(base, "admin@example.com"),
      smallAdmin: await signInCookie(base, "small-admin@example.com"),
    };
    const plans = Array.from({ length: 200 }, (_, i) => firstPlanId + ((i * 7919) % (lastPlanId - firstPlanId + 1)));
    // load-seed.ts makes every sixth plan approved (sealed) and the first three of each six drafts.
    const drafts = plans.filter((id) => (id - firstPlanId) % 6 < 3);
    const approved = plans.filter((id) => (id - firstPlanId) % 6 === 5);
    const newest = (await (
      await fetch(`${base}/api/plans?limit=1`, { headers: { Cookie: cookies.planner } })
    ).json()) as { plans: Array<{ jobId: number }> };
    const busyJob = newest.plans[0]!.jobId;
    // Both registers are read the same ways: the first page, the seventh (by its link) and sorted by due date.
    const registerPaths = async (cookie: string) => [
      "/gear",
      await registerPage(base, cookie, 7),
      "/gear?sort=nextDueOn",
    ];
    // Quick mode measures the pages with a target and those the registers' comparison needs; --full measures all.
    const allPages: Array<{ role: keyof typeof cookies; request: CannonRequest; target?: number; fullOnly?: boolean }> =
      [
        { role: "planner", request: { name: "ping", path: "/api/ping" } },
        { role: "planner", request: { name: "planner: dashboard", path: "/" }, target: TARGETS.pageVsPing },
        {
          role: "planner",
          request: { name: "planner: plan page", path: "/", paths: plans.map((id) => `/plans/${id}`) },
          target: TARGETS.pageVsPing,
        },
        {
          role: "planner",
          request: { name: "planner: editor route", path: "/", paths: drafts.map((id) => `/plans/${id}/edit`) },
          target: TARGETS.pageVsPing,
        },
        { role: "planner", request: { name: "planner: jobs", path: "/jobs" }, fullOnly: true },
        { role: "planner", request: { name: "planner: a job's plans", path: `/jobs/${busyJob}` }, fullOnly: true },
        { role: "planner", request: { name: "planner: /api/plans", path: "/api/plans" }, fullOnly: true },
        { role: "planner", request: { name: "planner: components", path: "/components" }, fullOnly: true },
        {
          role: "planner",
          request: { name: "planner: history", path: "/", paths: plans.map((id) => `/plans/${id}/history`) },
          fullOnly: true,
        },
        { role: "approver", request: { name: "approver: dashboard", path: "/" }, target: TARGETS.pageVsPing },
        { role: "rigger", request: { name: "rigger: dashboard", path: "/" }, target: TARGETS.pageVsPing },
        { role: "admin", request: { name: "admin: dashboard", path: "/" }, target: TARGETS.pageVsPing },
        { role: "admin", request: { name: "admin: users", path: "/admin" }, fullOnly: true },
        {
          role: "admin",
          request: { name: "admin: register", path: "/gear", paths: await registerPaths(cookies.admin) },
          target: TARGETS.pageVsPing,
        },
        {
          role: "admin",
          request: { name: "admin: register search", path: REGISTER_SEARCH },
          target: TARGETS.pageVsPing,
        },
        {
          role: "smallAdmin",
          request: { name: "small admin: register", path: "/gear", paths: await registerPaths(cookies.smallAdmin) },
        },
        { role: "smallAdmin", request: { name: "small admin: register search", path: REGISTER_SEARCH } },
      ];
    const pages = allPages.filter((page) => mode === "full" || !page.fullOnly);
    // Warm every route (JIT, SQLite's cache), then one connection each; ping again in the middle and at the end, so
    // the ratios use a ping measured on the same machine load as the pages.
    cannon(
      base,
      cookies.admin,
      4,
      1,
      pages.map((p) => ({ ...p.request, headers: { Cookie: cookies[p.role] } })),
    );
    const alone = new Map<string, CannonResult>();
    const pingRuns: CannonResult[] = [];
    pages.forEach((page, i) => {
      alone.set(page.request.name, cannon(base, cookies[page.role], 1, sizes.alone, [page.request]));
      if (i === Math.floor(pages.length / 2) || i === pages.length - 1)
        pingRuns.push(cannon(base, cookies.planner, 1, sizes.alone, [pages[0]!.request]));
    });
    const pingRps = median([alone.get("ping")!.requestsPerSecond, ...pingRuns.map((r) => r.requestsPerSecond)]);
    const pingP50 = median([alone.get("ping")!.p50, ...pingRuns.map((r) => r.p50)]);
    console.log(
      `pages: one connection each, compressed; ping ${pingRps.toFixed(0)} req/s, p50 ${pingP50.toFixed(1)} ms`,
    );
    for (const page of pages) {
      const r = alone.get(page.request.name)!;
      const ratio = r.requestsPerSecond / pingRps;
      const bad = r.errors + r.non2xx;
      console.log(
        `  ${page.request.name.padEnd(30)} ${ratio.toFixed(2)}x ping  p50 ${(r.p50 ?? Number.NaN).toFixed(1).padStart(6)} ms  ` +
          `${(r.bytesPerResponse / 1024).toFixed(1).padStart(6)} KB/response` +
          (page.target ? `  (target >= ${page.target}x ${ratio >= page.target ? "OK" : "MISSED"})` : "") +
          (bad ? `  ${bad} errors or non-2xx` : ""),
      );
      if (page.request.name === "ping") continue;
      note({
        name: `${page.request.name} vs ping`,
        value: ratio,
        unit: "ratio",
        target: page.target ?? Number.NaN,
        ok: page.target ? ratio >= page.target : true,
      });
    }
    const big = alone.get("admin: register")!;
    const small = alone.get("small admin: register")!;
    const bigSearch = alone.get("admin: register search")!;
    const smallSearch = alone.get("small admin: register search")!;
    for (const [name, b, s] of [
      ["register", big, small],
      ["register search", bigSearch, smallSearch],
    ] as const) {
      const slower = s.requestsPerSecond / b.requestsPerSecond;
      note({
        name: `${name}: ${sizes.gear.toLocaleString("en-GB")} items vs ${sizes.smallGear.toLocaleString("en-GB")} (time ratio)`,
        value: slower,
        unit: "x",
        target: TARGETS.smallVsBigRegister,
        ok: slower <= TARGETS.smallVsBigRegister,
      });
    }

    // Mixed: every role's pages together (in quick mode too), at 10 and at 50 connections.
    const mixed: CannonRequest[] = allPages.filter((p) => p.request.name !== "ping").map((p) => p.request);
    for (const connections of [10, 50]) {
      const runs = await Promise.all(
        (["planner", "admin"] as const).map((role) =>
          cannonAsync(base, cookies[role], connections / 2, sizes.mixed, mixed),
        ),
      );
      const p95 = Math.max(...runs.map((r) => r.p95));
      const errors = runs.reduce((n, r) => n + r.errors, 0);
      console.log(
        `pages: mixed at ${connections} connections: ${runs.map((r) => r.requestsPerSecond.toFixed(0)).join(" + ")} req/s, ` +
          `p50 ${Math.max(...runs.map((r) => r.p50)).toFixed(0)} ms, p95 ${p95.toFixed(0)} ms, ${errors} errors`,
      );
      note({
        name: `mixed p95 at ${connections} connections`,
        value: p95,
        unit: "ms",
        target: connections === 50 ? TARGETS.p95At50Ms : Number.NaN,
        ok: connections === 50 ? p95 < TARGETS.p95At50Ms : true,
      });
    }
    for (const w of workerMemory(server.pid))
      note({
        name: `worker ${w.pid} memory after load (peak ${w.peakMb.toFixed(0)} MB)`,
        value: w.rssMb,
        unit: "MB",
        target: Number.NaN,
        ok: true,
      });

    // The printed plan of a sealed revision: the first print, then the median of the next five.
    const pdfPlan = approved[0]!;
    const first = await timed(`${base}/plans/${pdfPlan}/print.pdf`, cookies.rigger);
    // Thirty more prints: the server's two workers each take their first few while their code is still cold, so
    // the run shows those on their own and the median of the thirty.
    const again: number[] = [];
    for (let i = 0; i < 30; i++) again.push((await timed(`${base}/plans/${pdfPlan}/print.pdf`, cookies.rigger)).ms);
    console.log(
      `pages: sealed PDF ${first.status}, ${(first.bytes / 1024).toFixed(0)} KB, first ${first.ms.toFixed(0)} ms; ` +
        `prints 2-7 ${again
          .slice(0, 6)
          .map((ms) => ms.toFixed(0))
          .join(", ")} ms; p95 of prints 2-31 ${percentile(again, 95).toFixed(0)} ms`,
    );
    const pdfMs = median(again);
    note({
      name: "sealed PDF from the second print",
      value: pdfMs,
      unit: "ms",
      target: TARGETS.sealedPdfMs,
      ok: pdfMs <= TARGETS.sealedPdfMs,
    });

    // Other requests beside prints: pings sent while one client prints the sealed plan ten times over.
    const besidePrints = await pingsDuring(base, cookies.planner, async () => {
      for (let i = 0; i < 10; i++) await timed(`${base}/plans/${pdfPlan}/print.pdf`, cookies.rigger);
    });
    console.log(
      `pages: ${besidePrints.pings} pings beside 10 sealed prints: worst ${besidePrints.worstMs.toFixed(0)} ms ` +
        `against ${besidePrints.baselineMs.toFixed(0)} ms for the slowest with nothing beside them`,
    );
    note({ name: "ping delayed by sealed prints (worst)", ...delayResult(besidePrints) });

    // The register export: time, size, how far the worker's peak memory rose and how long pings waited while it ran.
    const before = workerMemory(server.pid);
    let exported: Awaited<ReturnType<typeof timed>> | undefined;
    const besideExport = await pingsDuring(base, cookies.planner, async () => {
      exported = await timed(`${base}/gear/export.csv`, cookies.admin);
    });
    const after = workerMemory(server.pid);
    const rise = Math.max(...after.map((a) => a.peakMb - (before.find((b) => b.pid === a.pid)?.peakMb ?? a.peakMb)));
    console.log(
      `pages: export of ${sizes.gear.toLocaleString("en-GB")} items: ${exported!.status}, ` +
        `${(exported!.bytes / 1024).toFixed(0)} KB of CSV (sent compressed), ${exported!.ms.toFixed(0)} ms; ` +
        `${besideExport.pings} pings beside it, worst ${besideExport.worstMs.toFixed(0)} ms against ${besideExport.baselineMs.toFixed(0)} ms`,
    );
    note({ name: "export: worker peak memory rise", value: rise, unit: "MB", target: 50, ok: rise <= 50 });
    note({ name: "ping delayed by the export (worst)", ...delayResult(besideExport, TARGETS.stallMs) });
    return results;
  } finally {
    await server?.stop();
    database.remove();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const results = await runPagesBench(process.argv.includes("--full") ? "full" : "quick");
  for (const r of results) console.log(`${r.name}: ${r.value.toFixed(2)} ${r.unit}`);
}

export { cachedDatabase, cannon, cannonAsync, seedShaped, SIZES, type CannonRequest, type CannonResult };
