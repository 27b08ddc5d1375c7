// Builds printed plans on a worker thread, so a print (a hundred milliseconds and more of CPU) never holds up the
// other requests of its server process. The production server names the file a thread starts from (its own entry,
// `registerPdfWorkerFile`); elsewhere (development, tests) the PDF is built on the calling thread as before.
import { createHash } from "node:crypto";
import { readdirSync, readFileSync } from "node:fs";
import path from "node:path";
import { Worker } from "node:worker_threads";
import type { PdfAnswer, PdfJob } from "~/plans/pdf/worker.server";
import type { PrintablePlan } from "~/plans/printable";

export const PDF_WORKER_ROLE = "plumbline-pdf-builder";

let workerFile: string | null = null;
let worker: Worker | null = null;
let nextId = 1;
type Printed = { bytes: Uint8Array; body: Uint8Array | null };
const waiting = new Map<number, { resolve: (printed: Printed) => void; reject: (error: Error) => void }>();

/** Which code builds the PDFs: kept sealed bodies are reused only by the same builder. */
let builderVersion = "source";

/** Called by the production server at start: the file a PDF thread runs (it starts the builder on seeing its role). */
export function registerPdfWorkerFile(file: string) {
  workerFile = file;
  builderVersion = buildVersionOf(path.dirname(file));
}

/** SHA-256 over every file of the server build (a new build may print differently, so it builds bodies anew). */
function buildVersionOf(dir: string): string {
  const hash = createHash("sha256");
  const files = readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((entry) => entry.isFile())
    .map((entry) => path.join(entry.parentPath, entry.name))
    .sort();
  for (const file of files) hash.update(path.relative(dir, file)).update(readFileSync(file));
  return hash.digest("hex").slice(0, 32);
}

/** The PDF builder's version: "source" when built from the sources (development and tests), else the build's hash. */
export const pdfBuilderVersion = () => builderVersion;

function failAll(error: Error) {
  for (const { reject } of waiting.values()) reject(error);
  waiting.clear();
  worker = null;
}

function pdfWorker(): Worker | null {
  if (!workerFile) return null;
  if (worker) return worker;
  const started = new Worker(workerFile, { workerData: { role: PDF_WORKER_ROLE } });
  started.on("message", (answer: PdfAnswer) => {
    const job = waiting.get(answer.id);
    if (!job) return;
    waiting.delete(answer.id);
    if ("bytes" in answer) job.resolve({ bytes: answer.bytes, body: answer.body });
    else job.reject(new Error(answer.error));
  });
  started.on("error", (error) => failAll(error));
  started.on("exit", (code) => failAll(new Error(`The PDF builder thread stopped (exit code ${code}).`)));
  // Idle, it does not keep the process alive.
  started.unref();
  worker = started;
  return worker;
}

/**
 * One print of the plan on the builder thread when there is one (jobs queue there, one at a time): from the kept
 * sealed body when given, else from a new one, handed back to be kept.
 */
export function printPlanPdfOffThread(plan: PrintablePlan, kept: Uint8Array | null): Promise<Printed> {
  const thread = pdfWorker();
  // Loaded only when asked for: the server's primary process imports this file and never builds a PDF.
  if (!thread) return import("~/plans/pdf/build.server").then(({ printPlanPdf }) => printPlanPdf(plan, kept));
  const id = nextId++;
  return new Promise((resolve, reject) => {
    waiting.set(id, { resolve, reject });
    thread.postMessage({ id, plan, kept } satisfies PdfJob);
  });
}
