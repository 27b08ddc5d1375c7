// The production entry: the input of the SSR build (vite.config.ts), so it becomes build/server/index.js beside the
// React Router build and runs on plain `node`, no TypeScript loader:
//   node build/server/index.js [serve]          the server (`npm start`, `npm run demo`)
//   node build/server/index.js migrate | setup | down | backup [target] | restore <file> | reminders
// The commands are db/cli.ts's, loaded only when asked for. Settings come from the checked environment
// (utils/env.server.ts) alone.
//
// The server: Express with React Router's adapter, one worker process per core (WEB_CONCURRENCY), each serving the
// same SQLite file (WAL lets readers run beside the one writer; the busy timeout and IMMEDIATE transactions order the
// writers of different processes). The primary only forks and watches its workers.
//
// Against React Router's stock server this keeps two costs off every request: a file-system lookup in the static
// folders for each page and API path (only files the build holds are looked up), and source-map translation of the
// stack trace Sequelize captures on every query.
import cluster from "node:cluster";
import fs from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import zlib from "node:zlib";
import { isMainThread, workerData } from "node:worker_threads";
import { createRequestHandler } from "@react-router/express";
import compression from "compression";
import express, { type RequestHandler } from "express";
import type { ServerBuild } from "react-router";
import { PDF_WORKER_ROLE, registerPdfWorkerFile } from "~/plans/pdf/off-thread.server";

type Settings = { port: number; host: string | undefined; webConcurrency: number };

const ENTRY_FILE = fileURLToPath(import.meta.url);
const CLIENT_DIR = path.resolve(path.dirname(ENTRY_FILE), "../client");

/** Headers for files from the build (pages and API answers get theirs, a CSP included, from the root middleware). */
function setStaticHeaders(res: express.Response) {
  res.setHeader("X-Content-Type-Options", "nosniff");
  res.setHeader("Referrer-Policy", "same-origin");
  res.setHeader("Cross-Origin-Resource-Policy", "same-origin");
}

/** Every file in `dir`, as URL paths ("/favicon.svg"), listed once at start. */
function listFiles(dir: string, prefix = ""): string[] {
  if (!fs.existsSync(dir)) return [];
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const urlPath = `${prefix}/${entry.name}`;
    return entry.isDirectory() ? listFiles(path.join(dir, entry.name), urlPath) : [urlPath];
  });
}

/** Serves the build's files other than /assets (icons and the like): a lookup only for paths the build holds. */
function buildFiles(): RequestHandler {
  const known = new Set(listFiles(CLIENT_DIR).filter((p) => !p.startsWith("/assets/")));
  const serve = express.static(CLIENT_DIR, { maxAge: "1h", index: false, setHeaders: setStaticHeaders });
  return (req, res, next) => (known.has(req.path) ? serve(req, res, next) : next());
}

/**
 * One line per request, as morgan's "tiny" format wrote it (method, URL, status, length, time), for less: no format
 * compiled per line, the time taken from the monotonic clock once, and the lines of a busy moment written to stdout
 * together at the end of the event loop's turn.
 */
function requestLog(): RequestHandler {
  let pending: string[] = [];
  const flush = () => {
    process.stdout.write(pending.join(""));
    pending = [];
  };
  return (req, res, next) => {
    const start = performance.now();
    res.once("finish", () => {
      const length = res.getHeader("Content-Length") ?? "-";
      const ms = (performance.now() - start).toFixed(3);
      if (pending.length === 0) setImmediate(flush);
      pending.push(`${req.method} ${req.originalUrl} ${res.statusCode} ${length} - ${ms} ms\n`);
    });
    next();
  };
}

/**
 * Brotli quality 3 (browsers ask for br, which the compression package prefers) and gzip level 3 for the rest: each
 * about a page's millisecond of CPU on our largest pages, against half again for the package's brotli 4 and twice
 * for zlib's default gzip 6, for a few per cent more bytes (DEVELOPERS.md, "Compression").
 */
const COMPRESSION = {
  level: 3,
  brotli: { params: { [zlib.constants.BROTLI_PARAM_QUALITY]: 3 } },
};

/**
 * React Router's adapter flushes the compressor after every chunk React writes (a sync flush ends a deflate block
 * each time): a page of 90 KB cost several milliseconds and a half again in bytes. Flushes asked for within one turn
 * of the event loop are made once, at its end, so a page written in one go is compressed in one go, and what a page
 * streams later still goes out as soon as it is written.
 */
const coalesceFlushes: RequestHandler = (_req, res, next) => {
  const flushable = res as express.Response & { flush?: () => void };
  const flush = flushable.flush;
  if (typeof flush === "function") {
    let pending = false;
    flushable.flush = () => {
      if (pending) return;
      pending = true;
      setImmediate(() => {
        pending = false;
        if (!res.writableEnded) flush.call(res);
      });
    };
  }
  next();
};

/** The methods Plumbline takes anywhere; pages take GET, HEAD and POST, the JSON API also PUT (routes say which). */
const KNOWN_METHODS = new Set(["GET", "HEAD", "POST", "PUT", "PATCH", "DELETE"]);

/**
 * Answers any other method (TRACE, OPTIONS, PROPFIND...) with 405 before React Router sees it: TRACE, TRACK and
 * CONNECT cannot even become a fetch Request (the adapter threw, a 500), and React Router answers the rest itself
 * without the root middleware's headers.
 */
const refuseUnknownMethods: RequestHandler = (req, res, next) => {
  if (KNOWN_METHODS.has(req.method.toUpperCase())) return next();
  setStaticHeaders(res);
  res
    .status(405)
    .set({
      Allow: req.path.startsWith("/api/") ? "GET, HEAD, POST, PUT" : "GET, HEAD, POST",
      "Cache-Control": "no-store",
      "Content-Type": "text/plain; charset=utf-8",
    })
    .send(`Plumbline does not take ${req.method.slice(0, 20)} requests.`);
};

function address({ host, port }: Settings) {
  return `http://${host ?? "localhost"}:${port}`;
}

async function startWorker(settings: Settings) {
  // Node maps stack traces through source maps only when asked (--enable-source-maps); Sequelize formats a trace on
  // every query, so keep it off even then.
  process.setSourceMapsEnabled(false);
  // A chunk of its own: the primary never loads the app, its models or the database.
  const build = (await import("virtual:react-router/server-build")) as ServerBuild;
  // Printed plans are built on a thread started from this file.
  registerPdfWorkerFile(ENTRY_FILE);
  const app = express();
  app.disable("x-powered-by");
  app.use(compression(COMPRESSION));
  app.use(coalesceFlushes);
  app.use(
    "/assets",
    express.static(path.join(CLIENT_DIR, "assets"), {
      immutable: true,
      maxAge: "1y",
      index: false,
      setHeaders: setStaticHeaders,
    }),
  );
  app.use(buildFiles());
  app.use(requestLog());
  app.use(refuseUnknownMethods);
  // This file serves only the production build: errors reach the browser without their details.
  app.all("*", createRequestHandler({ build, mode: "production" }));
  const onListening = () => {
    if (cluster.isPrimary) console.log(`Plumbline on ${address(settings)}`);
    process.send?.({ listening: true });
    setImmediate(warmPrinting);
  };
  const { host, port } = settings;
  const server = host ? app.listen(port, host, onListening) : app.listen(port, onListening);
  server.on("error", (error) => {
    console.error(`Plumbline could not listen on ${host ?? "any address"}:${port}: ${error.message}`);
    process.exit(1);
  });
  // Finish the requests in hand, then leave; a second signal, or 10 s, ends it at once.
  const stop = () => {
    server.close(() => process.exit(0));
    server.closeIdleConnections();
    setTimeout(() => process.exit(0), 10_000).unref();
  };
  process.once("SIGTERM", stop);
  process.once("SIGINT", stop);
}

/**
 * Loads and runs the stamp of a printed plan once while the worker is idle after it starts listening, so that its
 * first prints of a kept body are not slowed by code and fonts loaded on demand.
 */
function warmPrinting() {
  import("~/plans/pdf/incremental-stamp.server")
    .then(({ warmIncrementalStamp }) => warmIncrementalStamp())
    .catch((error: unknown) =>
      console.error(`The print stamp could not be readied: ${error instanceof Error ? error.message : String(error)}`),
    );
}

function startPrimary(settings: Settings) {
  const workers = settings.webConcurrency;
  let stopping = false;
  const listeningWorkers = new Set<number>();
  for (let i = 0; i < workers; i++) cluster.fork();
  cluster.on("message", (worker, message: { listening?: boolean }) => {
    if (!message?.listening) return;
    listeningWorkers.add(worker.id);
    if (listeningWorkers.size === workers) console.log(`Plumbline on ${address(settings)} (${workers} workers)`);
  });
  const stopAll = () => {
    stopping = true;
    for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill("SIGTERM");
  };
  cluster.on("exit", (worker, code, signal) => {
    const hadListened = listeningWorkers.delete(worker.id);
    const how = signal ?? `exit code ${code}`;
    if (!stopping && hadListened) {
      console.error(`A Plumbline worker stopped (${how}); starting another.`);
      cluster.fork();
      return;
    }
    if (!stopping) {
      // It never served: a setting or the database is wrong, and another would fail the same way.
      console.error(`A Plumbline worker stopped before it could serve (${how}); see its message above. Stopping.`);
      process.exitCode = 1;
      stopAll();
    }
    if (Object.keys(cluster.workers ?? {}).length === 0) process.exit();
  });
  process.once("SIGTERM", stopAll);
  process.once("SIGINT", stopAll);
}

async function serve() {
  let settings: Settings;
  try {
    ({ env: settings } = await import("~/utils/env.server"));
  } catch (error) {
    // Refused before any worker starts: every one would fail the same way.
    console.error(error instanceof Error ? error.message : error);
    console.error("Plumbline stopped before it could serve.");
    process.exit(1);
  }
  // Once per start, whatever the number of workers: partial upload files that interrupted writes left behind.
  if (cluster.isPrimary)
    import("~/utils/file-store.server")
      .then((store) => store.sweepAbandonedPartials())
      .catch((error: unknown) => console.error(`The upload folder was not swept: ${String(error)}`));
  if (cluster.isPrimary && settings.webConcurrency > 1) startPrimary(settings);
  else await startWorker(settings);
}

async function runCommand(command: string, argument: string | undefined, secondArgument: string | undefined) {
  try {
    const { runDatabaseCommand } = await import("../../db/cli");
    await runDatabaseCommand(command, argument, secondArgument);
    process.exit(0);
  } catch (error) {
    console.error(error instanceof Error ? error.message : error);
    process.exit(1);
  }
}

// A thread this file was started as by the server (the PDF builder) does that job only.
if (!isMainThread && (workerData as { role?: string } | null)?.role === PDF_WORKER_ROLE) {
  const { servePdfJobs } = await import("~/plans/pdf/worker.server");
  servePdfJobs();
} else if (process.argv[1] && path.resolve(process.argv[1]) === ENTRY_FILE) {
  // Only when node runs this file, never when something imports it.
  const command = process.argv[2] ?? "serve";
  if (command === "serve") await serve();
  else await runCommand(command, process.argv[3], process.argv[4]);
}
