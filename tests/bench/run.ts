// `npm run bench`: the statics core's solves per second, and /api/solve against a trivial JSON
// route on the same built server in the same run. A benchmark, never a timed test: it prints.
import { startBuiltServer, signInCookie } from "../support/built-server";
import { runEditorBench } from "./editor";
import { runLoadBench } from "./load";
import { runPagesBench } from "./pages";
import { runPdfBench } from "./pdf";
import { runPostgresBench } from "./postgres";
import { runStaticsBench, type BenchResult } from "./statics";

function median(values: number[]) {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

const SOLVE_BODY = JSON.stringify({
  load: { massKg: 2000, cog: { x: 0.02, y: 0, z: -0.4 } },
  liftPoints: [
    { id: "A", x: 0.9, y: 0.2, z: 0 },
    { id: "B", x: -0.7, y: 0.5, z: 0 },
    { id: "C", x: -0.3, y: -0.7, z: 0 },
  ],
  hook: { z: 1.2 },
});

async function timeRequests(make: () => Promise<Response>, count: number) {
  const times: number[] = [];
  for (let i = 0; i < count; i++) {
    const start = performance.now();
    const res = await make();
    await res.arrayBuffer();
    if (!res.ok) throw new Error(`benchmark request failed: ${res.status}`);
    times.push(performance.now() - start);
  }
  return times;
}

async function runHttpBench(): Promise<BenchResult[]> {
  const server = await startBuiltServer();
  try {
    const cookie = await signInCookie(server.baseUrl, "planner@example.com");
    const ping = () => fetch(`${server.baseUrl}/api/ping`, { headers: { Cookie: cookie } });
    const solve = () =>
      fetch(`${server.baseUrl}/api/solve`, {
        method: "POST",
        body: SOLVE_BODY,
        headers: { Cookie: cookie, Origin: server.baseUrl, "Content-Type": "application/json" },
      });
    await timeRequests(ping, 200);
    await timeRequests(solve, 200);
    const pingTimes: number[] = [];
    const solveTimes: number[] = [];
    // Interleave in rounds so both routes see the same machine load.
    for (let round = 0; round < 10; round++) {
      pingTimes.push(...(await timeRequests(ping, 100)));
      solveTimes.push(...(await timeRequests(solve, 100)));
    }
    const pingMedian = median(pingTimes);
    const solveMedian = median(solveTimes);
    const ratio = solveMedian / pingMedian;
    return [
      { name: "GET /api/ping median", value: pingMedian, unit: "ms", target: Number.NaN, ok: true },
      { name: "POST /api/solve median", value: solveMedian, unit: "ms", target: Number.NaN, ok: true },
      { name: "/api/solve vs trivial route", value: ratio, unit: "x", target: 1.3, ok: ratio <= 1.3 },
    ];
  } finally {
    await server.stop();
  }
}

function print(results: BenchResult[]) {
  for (const r of results) {
    const value = r.unit === "solves/s" ? Math.round(r.value).toLocaleString("en-GB") : r.value.toFixed(3);
    const atMost = r.unit === "x" || r.unit === "ms" || r.unit === "KB" || r.unit === "MB";
    const target = Number.isNaN(r.target)
      ? ""
      : ` (target ${atMost ? "<=" : ">="} ${r.target.toLocaleString("en-GB")})`;
    console.log(`${r.name}: ${value} ${r.unit}${target}${Number.isNaN(r.target) ? "" : r.ok ? " OK" : " MISSED"}`);
  }
}

// Quick by default: the printed plan, every role's pages on a mid-sized organisation and the editor in Chromium
// (about a minute after the build). `npm run bench -- --full`: also the statics core, the 10,000-plan / 50,000-item
// organisation, the long load and the same pages on PostgreSQL beside SQLite.
// `--only=pdf,pages,postgres,editor` runs just those sections at the quick sizes (postgres included when named).
const full = process.argv.includes("--full");
const only = process.argv
  .find((arg) => arg.startsWith("--only="))
  ?.slice("--only=".length)
  .split(",");
const wanted = (section: string) => !only || only.includes(section);
const benchStarted = performance.now();
const results = full
  ? [
      ...(await runStaticsBench()),
      ...(await runPdfBench()),
      ...(await runHttpBench()),
      ...(await runLoadBench()),
      ...(await runPagesBench("full")),
      ...(await runPostgresBench("full")),
    ]
  : [
      ...(wanted("pdf") ? await runPdfBench() : []),
      ...(wanted("pages") ? await runPagesBench("quick") : []),
      ...(only?.includes("postgres") ? await runPostgresBench("quick") : []),
    ];
if (!full && !only?.includes("postgres"))
  console.log("postgres: the comparison with PostgreSQL runs with -- --full (or -- --only=postgres)");
print([...results, ...(wanted("editor") ? await runEditorBench() : [])]);
console.log(
  `bench (${full ? "full" : only ? only.join(", ") : "quick"}) took ${((performance.now() - benchStarted) / 1000).toFixed(0)} s after the build`,
);
