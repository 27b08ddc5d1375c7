// Builds printed plans on a worker thread, so a print (a hundred milliseconds and more of CPU) never holds up the
// other requests of its server process. The production server names the file a thread starts from (its own entry,
// `registerPdfWorkerFile`); elsewhere (development, tests) the PDF is built on the calling thread as before.
import { Worker } from "node:worker_threads";
import type { PdfAnswer, PdfJob } from "~/plans/pdf/worker.server";
import type { PrintablePlan } from "~/plans/printable";

export const PDF_WORKER_ROLE = "plumbline-pdf-builder";

let workerFile: string | null = null;
let worker: Worker | null = null;
let nextId = 1;
const waiting = new Map<number, { resolve: (bytes: Uint8Array) => void; reject: (error: Error) => void }>();

/** Called by the production server at start: the file a PDF thread runs (it starts the builder on seeing its role). */
export function registerPdfWorkerFile(file: string) {
  workerFile = file;
}

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
    if ("bytes" in answer) job.resolve(answer.bytes);
    else job.reject(new Error(answer.error));
  });
  started.on("error", (error) => failAll(error));
  started.on("exit", (code) => failAll(new Error(`The PDF builder thread stopped (exit code ${code}).`)));
  // Idle, it does not keep the process alive.
  started.unref();
  worker = started;
  return worker;
}

/** The plan's PDF, built on the builder thread when there is one (jobs queue there, one at a time). */
export function buildPlanPdfOffThread(plan: PrintablePlan): Promise<Uint8Array> {
  const thread = pdfWorker();
  // Loaded only when asked for: the server's primary process imports this file and never builds a PDF.
  if (!thread) return import("~/plans/pdf/build.server").then(({ buildPlanPdf }) => buildPlanPdf(plan));
  const id = nextId++;
  return new Promise((resolve, reject) => {
    waiting.set(id, { resolve, reject });
    thread.postMessage({ id, plan } satisfies PdfJob);
  });
}
