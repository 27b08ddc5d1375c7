// The app under load: the demo scenario grown to 10,000 plans and 5,000 gear items, served by the
// production build on loopback, driven by autocannon with 50 connections on a mixed workload
// (dashboard, plan page, /api/solve, gear register pages) for LOAD_SECONDS (default 60); then the plan
// page alone against the trivial /api/ping; and the editor's client JavaScript beyond the shell.
// A benchmark: it prints figures against targets and never fails a build. Run: npx tsx tests/bench/load.ts
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import { createRequire } from "node:module";
import path from "node:path";
import zlib from "node:zlib";
import { signInCookie, startBuiltServer } from "../support/built-server";
import type { BenchResult } from "./statics";

export const LOAD_PLANS = 10_000;
export const LOAD_GEAR_ITEMS = 5_000;
export const LOAD_CONNECTIONS = 50;
export const P95_TARGET_MS = 100;
export const PLAN_PAGE_RATIO_TARGET = 0.5;
export const EDITOR_JS_TARGET_KB = 200;
/** The register's page cursor after the load seed's item `n` (load-seed.ts names them LD-00001...). */
const gearCursor = (n: number) =>
  Buffer.from(JSON.stringify([`LD-${String(n).padStart(5, "0")}`])).toString("base64url");

// autocannon ships no type declarations: the part of its API used here.
type AutocannonRequest = {
  method?: "GET" | "POST";
  path: string;
  headers?: Record<string, string>;
  body?: string;
  setupRequest?: (request: AutocannonRequest, context: Record<string, unknown>) => AutocannonRequest;
  onResponse?: (status: number, body: string, context: Record<string, unknown>) => void;
};
type AutocannonResult = {
  duration: number;
  errors: number;
  timeouts: number;
  non2xx: number;
  requests: { average: number; total: number };
  latency: { p50: number; p99: number; average: number };
  statusCodeStats: Record<string, { count: number }>;
};
type AutocannonClient = { requestIterator?: { currentRequestIndex?: number } };
type AutocannonInstance = Promise<AutocannonResult> & {
  on(
    event: "response",
    listener: (client: AutocannonClient, statusCode: number, bytes: number, responseTimeMs: number) => void,
  ): void;
};
type Autocannon = (options: {
  url: string;
  connections: number;
  duration: number;
  headers?: Record<string, string>;
  requests: AutocannonRequest[];
  timeout?: number;
}) => AutocannonInstance;
const autocannon = createRequire(import.meta.url)("autocannon") as Autocannon;

const SOLVE_BODY = JSON.stringify({
  load: { massKg: 2400, cog: { x: 0.05, y: -0.02, z: 0.45 } },
  liftPoints: [
    { id: "A", x: 0.6, y: 0.4, z: 0.9 },
    { id: "B", x: -0.6, y: 0.4, z: 0.9 },
    { id: "C", x: -0.6, y: -0.4, z: 0.9 },
    { id: "D", x: 0.6, y: -0.4, z: 0.9 },
  ],
  hook: { z: 2.4 },
  rigging: {
    legs: Object.fromEntries(
      ["A", "B", "C", "D"].map((id) => [
        id,
        {
          sling: { kind: "chain", diameterMm: 8, grade: "8" },
          shackle: { type: "bow", pin: "bolt", wllKg: 3250 },
          eyebolt: { family: "collar", thread: "M20" },
        },
      ]),
    ),
    masterLink: { wllKg: 6700 },
    crane: { swlKg: 5000, maxHookHeightM: 6.5 },
    contingencyPct: 10,
    riggingMassKg: 45,
  },
});

function percentile(sorted: number[], p: number) {
  if (sorted.length === 0) return Number.NaN;
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!;
}

type RouteFigures = {
  name: string;
  count: number;
  p50: number;
  p95: number;
  p99: number;
  non2xx: number;
  statuses: Record<number, number>;
};

/** Runs autocannon over `requests` (each connection cycles through them in order), with per-route latencies. */
async function drive(
  baseUrl: string,
  cookie: string,
  seconds: number,
  requests: Array<AutocannonRequest & { name: string }>,
) {
  const perRoute = requests.map(() => ({ times: [] as number[], non2xx: 0, statuses: {} as Record<number, number> }));
  const all: number[] = [];
  const instance = autocannon({
    url: baseUrl,
    connections: LOAD_CONNECTIONS,
    duration: seconds,
    timeout: 10,
    headers: { Cookie: cookie, Origin: baseUrl },
    requests: requests.map(({ name: _name, ...request }, i) => ({
      ...request,
      onResponse: (status: number) => {
        const statuses = perRoute[i]!.statuses;
        statuses[status] = (statuses[status] ?? 0) + 1;
      },
    })),
  });
  instance.on("response", (client, statusCode, _bytes, responseTimeMs) => {
    all.push(responseTimeMs);
    // The client still points at the request it has just had answered (the next is set up after this event).
    const index = client.requestIterator?.currentRequestIndex ?? -1;
    const route = perRoute[index];
    if (!route) return;
    route.times.push(responseTimeMs);
    if (statusCode < 200 || statusCode > 299) route.non2xx++;
  });
  const result = await instance;
  const sortedAll = all.sort((a, b) => a - b);
  const routes: RouteFigures[] = perRoute.map((r, i) => {
    const sorted = r.times.sort((a, b) => a - b);
    return {
      name: requests[i]!.name,
      count: sorted.length,
      p50: percentile(sorted, 50),
      p95: percentile(sorted, 95),
      p99: percentile(sorted, 99),
      non2xx: r.non2xx,
      statuses: r.statuses,
    };
  });
  return {
    result,
    requestsPerSecond: result.requests.total / result.duration,
    p50: percentile(sortedAll, 50),
    p95: percentile(sortedAll, 95),
    p99: percentile(sortedAll, 99),
    routes,
  };
}

function randomInt(min: number, max: number) {
  return min + Math.floor(Math.random() * (max - min + 1));
}

/** Relative .js files a built chunk imports, statically, by import() or through Vite's preload map. */
function chunkImports(source: string): string[] {
  const found = new Set<string>();
  for (const m of source.matchAll(/(?:from|import)\s*\(?\s*["'`]\.\/([\w.$-]+\.js)["'`]/g)) found.add(m[1]!);
  for (const m of source.matchAll(/["'`]assets\/([\w.$-]+\.js)["'`]/g)) found.add(m[1]!);
  return [...found];
}

function closure(assetsDir: string, roots: string[]) {
  const seen = new Set<string>();
  const queue = roots.map((r) => path.basename(r));
  while (queue.length) {
    const file = queue.pop()!;
    if (seen.has(file)) continue;
    seen.add(file);
    queue.push(...chunkImports(fs.readFileSync(path.join(assetsDir, file), "utf8")));
  }
  return seen;
}

type ManifestEntry = { module: string; imports?: string[] };

/**
 * Gzipped size of the JavaScript the editor route pulls in (its module, its imports and what it loads
 * lazily, i.e. the Konva views) beyond what every page loads anyway (entry, root and their imports).
 */
export function editorJsBeyondShell(buildClientDir = "build/client") {
  const assetsDir = path.join(buildClientDir, "assets");
  const manifests = fs
    .readdirSync(assetsDir)
    .filter((f) => /^manifest-[\w-]+\.js$/.test(f))
    .map((f) => path.join(assetsDir, f))
    .sort((a, b) => fs.statSync(b).mtimeMs - fs.statSync(a).mtimeMs);
  if (!manifests[0]) throw new Error("No React Router client manifest in build/client/assets: build first.");
  const text = fs.readFileSync(manifests[0], "utf8");
  const manifest = JSON.parse(text.slice(text.indexOf("{"), text.lastIndexOf("}") + 1)) as {
    entry: ManifestEntry;
    routes: Record<string, ManifestEntry>;
  };
  const root = manifest.routes.root!;
  const editor = manifest.routes["routes/plans.$planId.edit"];
  if (!editor) throw new Error("The manifest has no routes/plans.$planId.edit.");
  const shell = closure(assetsDir, [
    manifest.entry.module,
    ...(manifest.entry.imports ?? []),
    root.module,
    ...(root.imports ?? []),
  ]);
  const route = closure(assetsDir, [editor.module, ...(editor.imports ?? [])]);
  const gzipKb = (files: Iterable<string>) =>
    [...files].reduce((sum, f) => sum + zlib.gzipSync(fs.readFileSync(path.join(assetsDir, f))).length, 0) / 1024;
  const beyond = [...route].filter((f) => !shell.has(f));
  return { beyondKb: gzipKb(beyond), shellKb: gzipKb(shell), files: beyond.sort() };
}

/** Seeds, serves and loads the app; returns the figures (also printed as they come, with a per-route breakdown). */
export async function runLoadBench(): Promise<BenchResult[]> {
  const seconds = Math.max(1, Number(process.env.LOAD_SECONDS ?? 60));
  const compareSeconds = Math.min(10, seconds);
  let seeded = { firstPlanId: 1, lastPlanId: 1, plans: 0, gearItems: 0, seconds: 0 };
  const seedStarted = performance.now();
  const server = await startBuiltServer({
    prepare: (env) => {
      const run = spawnSync(
        process.execPath,
        ["node_modules/tsx/dist/cli.mjs", "tests/bench/load-seed.ts", String(LOAD_PLANS), String(LOAD_GEAR_ITEMS)],
        { env, encoding: "utf8" },
      );
      if (run.status !== 0) throw new Error(`load seeding failed: ${run.stderr}`);
      seeded = JSON.parse(run.stdout.trim().split("\n").pop()!) as typeof seeded;
      if (seeded.plans < LOAD_PLANS || seeded.gearItems < LOAD_GEAR_ITEMS)
        throw new Error(`load seeding came up short: ${run.stdout}`);
    },
  });
  try {
    const mb = fs.statSync(server.databasePath).size / 1024 / 1024;
    console.log(
      `load: ${seeded.plans.toLocaleString("en-GB")} plans and ${seeded.gearItems.toLocaleString("en-GB")} gear items (demo + seeded in ${seeded.seconds.toFixed(1)} s; ` +
        `server up after ${((performance.now() - seedStarted) / 1000).toFixed(1)} s), database ${mb.toFixed(0)} MB`,
    );
    const cookie = await signInCookie(server.baseUrl, "planner@example.com");
    const planPath = () => `/plans/${randomInt(seeded.firstPlanId, seeded.lastPlanId)}`;
    const mixed: Array<AutocannonRequest & { name: string }> = [
      { name: "GET /", method: "GET", path: "/" },
      { name: "GET /plans/:id", method: "GET", path: "/plans/1", setupRequest: (r) => ({ ...r, path: planPath() }) },
      {
        name: "POST /api/solve",
        method: "POST",
        path: "/api/solve",
        headers: { "Content-Type": "application/json" },
        body: SOLVE_BODY,
      },
      {
        name: "GET /gear?after=N",
        method: "GET",
        path: "/gear",
        // A page from anywhere in the register: the one after a random item (its id is the page's cursor).
        setupRequest: (r) => ({ ...r, path: `/gear?after=${gearCursor(randomInt(1, LOAD_GEAR_ITEMS))}` }),
      },
    ];
    // Warm the JIT and SQLite's page cache before anything is counted.
    await drive(server.baseUrl, cookie, Math.min(5, seconds), mixed);

    const load = await drive(server.baseUrl, cookie, seconds, mixed);
    console.log(`load: mixed workload, ${LOAD_CONNECTIONS} connections, ${seconds} s`);
    for (const r of load.routes) {
      const statuses = Object.entries(r.statuses)
        .map(([code, n]) => `${code} x${n}`)
        .join(", ");
      console.log(
        `  ${r.name.padEnd(18)} ${String(r.count).padStart(7)} responses  p50 ${r.p50.toFixed(1)} ms  p95 ${r.p95.toFixed(1)} ms  p99 ${r.p99.toFixed(1)} ms  (${statuses})`,
      );
    }
    const errors = load.result.errors + load.result.timeouts;

    const ping = await drive(server.baseUrl, cookie, compareSeconds, [
      { name: "GET /api/ping", method: "GET", path: "/api/ping" },
    ]);
    const planOnly = await drive(server.baseUrl, cookie, compareSeconds, [mixed[1]!]);
    const ratio = planOnly.requestsPerSecond / ping.requestsPerSecond;
    console.log(
      `load: ${compareSeconds} s alone: /api/ping ${ping.requestsPerSecond.toFixed(0)} req/s (p95 ${ping.p95.toFixed(1)} ms), ` +
        `plan page ${planOnly.requestsPerSecond.toFixed(0)} req/s (p95 ${planOnly.p95.toFixed(1)} ms)`,
    );
    const js = editorJsBeyondShell();
    console.log(
      `load: editor JS beyond the shell (the shell itself is ${js.shellKb.toFixed(1)} KB gzipped): ${js.files.join(", ")}`,
    );

    const aloneErrors = ping.result.errors + ping.result.timeouts + planOnly.result.errors + planOnly.result.timeouts;
    const aloneNon2xx = ping.result.non2xx + planOnly.result.non2xx;
    return [
      { name: "load mixed: throughput", value: load.requestsPerSecond, unit: "req/s", target: Number.NaN, ok: true },
      { name: "load mixed: latency p50", value: load.p50, unit: "ms", target: Number.NaN, ok: true },
      {
        name: "load mixed: latency p95",
        value: load.p95,
        unit: "ms",
        target: P95_TARGET_MS,
        ok: load.p95 < P95_TARGET_MS,
      },
      { name: "load mixed: latency p99", value: load.p99, unit: "ms", target: Number.NaN, ok: true },
      // print() in run.ts reads "at most" only from the units ms, x and KB, so the zero targets are named here.
      {
        name: "load mixed: errors and timeouts (target 0)",
        value: errors,
        unit: "errors",
        target: Number.NaN,
        ok: errors === 0,
      },
      {
        name: "load mixed: non-2xx responses (target 0)",
        value: load.result.non2xx,
        unit: "responses",
        target: Number.NaN,
        ok: load.result.non2xx === 0,
      },
      {
        name: "load alone: errors, timeouts and non-2xx (target 0)",
        value: aloneErrors + aloneNon2xx,
        unit: "responses",
        target: Number.NaN,
        ok: aloneErrors + aloneNon2xx === 0,
      },
      { name: "load: GET /api/ping alone", value: ping.requestsPerSecond, unit: "req/s", target: Number.NaN, ok: true },
      { name: "load: plan page alone", value: planOnly.requestsPerSecond, unit: "req/s", target: Number.NaN, ok: true },
      {
        name: "load: plan page vs trivial route throughput",
        value: ratio,
        unit: "ratio",
        target: PLAN_PAGE_RATIO_TARGET,
        ok: ratio >= PLAN_PAGE_RATIO_TARGET,
      },
      {
        name: "editor route client JS beyond the shell, gzipped",
        value: js.beyondKb,
        unit: "KB",
        target: EDITOR_JS_TARGET_KB,
        ok: js.beyondKb <= EDITOR_JS_TARGET_KB,
      },
    ];
  } finally {
    await server.stop();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const results = await runLoadBench();
  for (const r of results) {
    const atMost = r.unit !== "ratio";
    const target = Number.isNaN(r.target)
      ? ""
      : ` (target ${atMost ? "<=" : ">="} ${r.target}) ${r.ok ? "OK" : "MISSED"}`;
    console.log(`${r.name}: ${r.value.toFixed(r.unit === "ratio" ? 3 : 1)} ${r.unit}${target}`);
  }
}
