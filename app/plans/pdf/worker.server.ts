// The printed plan's builder thread: takes a printable plan, answers with its PDF bytes (or the error's message).
// Started by off-thread.server.ts from the server's own entry file, so it needs no file of its own in the build.
import { parentPort } from "node:worker_threads";
import { buildPlanPdf } from "~/plans/pdf/build.server";
import type { PrintablePlan } from "~/plans/printable";

export type PdfJob = { id: number; plan: PrintablePlan };
export type PdfAnswer = { id: number; bytes: Uint8Array } | { id: number; error: string };

export function servePdfJobs() {
  const port = parentPort;
  if (!port) throw new Error("The PDF builder runs only as a worker thread.");
  port.on("message", async (job: PdfJob) => {
    try {
      const bytes = await buildPlanPdf(job.plan);
      port.postMessage({ id: job.id, bytes } satisfies PdfAnswer, [bytes.buffer as ArrayBuffer]);
    } catch (error) {
      port.postMessage({
        id: job.id,
        error: error instanceof Error ? error.message : String(error),
      } satisfies PdfAnswer);
    }
  });
}
