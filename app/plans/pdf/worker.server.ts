// The printed plan's builder thread: takes a printable plan and its kept sealed body (or none), answers with the
// print's PDF bytes and, when it had to build one, the new sealed body to keep (or the error's message).
// Started by off-thread.server.ts from the server's own entry file, so it needs no file of its own in the build.
import { parentPort } from "node:worker_threads";
import { printPlanPdf } from "~/plans/pdf/build.server";
import type { PrintablePlan } from "~/plans/printable";

export type PdfJob = { id: number; plan: PrintablePlan; kept: Uint8Array | null };
export type PdfAnswer = { id: number; bytes: Uint8Array; body: Uint8Array | null } | { id: number; error: string };

export function servePdfJobs() {
  const port = parentPort;
  if (!port) throw new Error("The PDF builder runs only as a worker thread.");
  port.on("message", async (job: PdfJob) => {
    try {
      const { bytes, body } = await printPlanPdf(job.plan, job.kept);
      const moved = [bytes.buffer as ArrayBuffer, ...(body ? [body.buffer as ArrayBuffer] : [])];
      port.postMessage({ id: job.id, bytes, body } satisfies PdfAnswer, moved);
    } catch (error) {
      port.postMessage({
        id: job.id,
        error: error instanceof Error ? error.message : String(error),
      } satisfies PdfAnswer);
    }
  });
}
