// Prints of a sealed revision reuse its sealed body: the PDF of everything the sealed record decides is
// built on the first print, kept in the database, and each later print only stamps the live band and the
// printed line on it (see build.server.ts).
import { createHash } from "node:crypto";
import { getSealedPrintBody, keepSealedPrintBody } from "~/models/sealed-print-body.server";
import { pdfBuilderVersion, printPlanPdfOffThread } from "~/plans/pdf/off-thread.server";
import type { PrintablePlan } from "~/plans/printable";

/**
 * The key of a plan's sealed body: everything the body depends on besides the sealed record's fingerprint
 * (the reader's units, the status, the QR code's address, whether the header holds a band) and the builder.
 */
export function sealedBodyKey(plan: PrintablePlan): string {
  const band = plan.liftRecord ? "lift" : plan.live ? "live" : "none";
  const parts = [pdfBuilderVersion(), plan.fingerprint, plan.units, plan.status, plan.verifyUrl, band];
  return createHash("sha256").update(JSON.stringify(parts)).digest("hex");
}

/**
 * Bodies printed lately in this process, by key, up to a few megabytes: a key names exactly one body (the same
 * sealed content, reader's units, status, address and builder), so a reprint need not read it again.
 */
const recentBodies = new Map<string, Uint8Array>();
const RECENT_BODY_BYTES = 8 * 1024 * 1024;
let recentBytes = 0;

function remember(key: string, body: Uint8Array) {
  if (recentBodies.has(key) || body.length > RECENT_BODY_BYTES) return;
  recentBodies.set(key, body);
  recentBytes += body.length;
  for (const [oldest, kept] of recentBodies) {
    if (recentBytes <= RECENT_BODY_BYTES) break;
    recentBodies.delete(oldest);
    recentBytes -= kept.length;
  }
}

async function keptBody(key: string): Promise<Uint8Array | null> {
  const known = recentBodies.get(key);
  if (known) {
    // Most recently used last: the first is the one to drop.
    recentBodies.delete(key);
    recentBodies.set(key, known);
    return known;
  }
  const kept = await getSealedPrintBody(key);
  if (kept) remember(key, kept);
  return kept;
}

/**
 * The PDF of one print of a sealed revision. With a kept body only the stamp runs, here on the request's
 * thread (about a millisecond as an incremental update, a few drawn in full; no hop to the builder thread, which a
 * process may not have started yet);
 * without one the body is built on the builder thread and kept.
 */
export async function printSealedPlan(plan: PrintablePlan, revisionId: number): Promise<Uint8Array> {
  const key = sealedBodyKey(plan);
  const kept = await keptBody(key);
  if (kept) {
    // The incremental stamp first: its code is small and readied when the server starts (utils/serve.server.ts).
    const { stampIncrementally } = await import("~/plans/pdf/incremental-stamp.server");
    const stamped = await stampIncrementally(kept, plan);
    if (stamped) return stamped;
    const { stampPrintInFull } = await import("~/plans/pdf/build.server");
    return stampPrintInFull(kept, plan);
  }
  const { bytes, body } = await printPlanPdfOffThread(plan, null);
  if (body) {
    await keepSealedPrintBody(revisionId, pdfBuilderVersion(), key, body);
    remember(key, body);
  }
  return bytes;
}
