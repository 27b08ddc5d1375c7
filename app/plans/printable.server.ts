// Gathers what the printed plan shows: the sealed record of the current approved revision (or of the
// completed one, as the record of its lift), with the gear's state now. Nothing is read from the
// plan's live rows.
import { getLiftRecord } from "~/models/lift-record.server";
import { getPlanSeals, getRevisionSealed, type RevisionSeal } from "~/models/plan.server";
import { userNames, type SessionUser } from "~/models/user.server";
import { PLAN_STATUS_LABELS, type PlanStatus } from "~/plans/document";
import { liveStateOf } from "~/plans/live-state.server";
import type { PrintablePlan } from "~/plans/printable";
import { readSealed, type SealedPlan } from "~/plans/sealed";
import { absoluteUrl } from "~/utils/mail.server";

export type PrintableOutcome =
  | { ok: true; printable: PrintablePlan; revision: number; revisionId: number }
  | { ok: false; status: 404 | 409; message: string; planId: number };

const latest = <R extends Pick<RevisionSeal, "status" | "revision">>(rows: R[], status: R["status"]) =>
  rows.filter((r) => r.status === status).sort((a, b) => b.revision - a.revision)[0] ?? null;

/** Why nothing of the plan prints, from where its working revision stands. */
function notPrintable(working: Pick<RevisionSeal, "status" | "revision"> | undefined): string {
  const status: PlanStatus = working?.status ?? "draft";
  const where = `Revision ${working?.revision ?? 1} is ${status === "draft" ? "a draft" : PLAN_STATUS_LABELS[status].toLowerCase()}`;
  if (status === "cancelled") return `The plan is cancelled, so it is not printed. ${where}.`;
  return `The plan has no approved revision to print yet. ${where}: it prints once an appointed person has approved it.`;
}

/**
 * Sealed records read lately, by revision and fingerprint. A revision's sealed record never changes once sealed
 * (its fingerprint is its hash), so a reprint neither reads nor parses it again in this process.
 */
const recentSealed = new Map<string, SealedPlan>();
const RECENT_SEALED = 64;

async function sealedRecordOf(row: RevisionSeal): Promise<SealedPlan | null> {
  const key = `${row.id}:${row.fingerprint}`;
  const known = recentSealed.get(key);
  if (known) {
    // Most recently used last: the first is the one to drop.
    recentSealed.delete(key);
    recentSealed.set(key, known);
    return known;
  }
  const sealed = readSealed(await getRevisionSealed(row.planId, row.id));
  if (!sealed) return null;
  recentSealed.set(key, sealed);
  if (recentSealed.size > RECENT_SEALED) recentSealed.delete(recentSealed.keys().next().value!);
  return sealed;
}

/** The printable plan for the plan's current approved revision, else its completed one; 409 with the reason otherwise. */
export async function buildPrintablePlan(
  user: SessionUser,
  planId: number,
  request: Request,
): Promise<PrintableOutcome> {
  // Where each revision stands and its seal first; then the sealed record of the one printed.
  const plan = await getPlanSeals(user.organisationId, planId);
  if (!plan) return { ok: false, status: 404, message: "There is no such plan in your organisation.", planId };
  const { revisions } = plan;
  const row = latest(revisions, "approved") ?? latest(revisions, "completed");
  if (!row) {
    const working = revisions.find((r) => r.id === plan.currentRevisionId);
    return { ok: false, status: 409, message: notPrintable(working), planId };
  }
  const sealed = row.fingerprint && row.verifyToken ? await sealedRecordOf(row) : null;
  if (!sealed || !row.fingerprint || !row.verifyToken) {
    return {
      ok: false,
      status: 409,
      message: `Revision ${row.revision} was approved before approved plans were sealed, so there is no sealed record to print. Start a new revision and have it approved.`,
      planId,
    };
  }
  const live = row.status === "approved" ? await liveStateOf(user.organisationId, sealed) : null;
  const record = row.status === "completed" ? await getLiftRecord(row.id) : null;
  const recorder = record ? (await userNames(user.organisationId, [record.recordedBy])).get(record.recordedBy) : null;
  return {
    ok: true,
    revision: row.revision,
    revisionId: row.id,
    printable: printableFrom(user, row, sealed, request, {
      live,
      liftRecord: record ? { liftedAt: record.liftedAt.toISOString(), by: recorder ?? "unknown" } : null,
    }),
  };
}

/** The printable plan of a sealed revision, printed now by `user` in their units. */
export function printableFrom(
  user: SessionUser,
  row: Pick<RevisionSeal, "status" | "fingerprint" | "verifyToken">,
  sealed: SealedPlan,
  request: Request,
  extra: Pick<PrintablePlan, "live" | "liftRecord">,
): PrintablePlan {
  return {
    ...sealed,
    status: row.status === "completed" ? "completed" : "approved",
    units: user.units,
    fingerprint: row.fingerprint ?? "",
    verifyUrl: absoluteUrl(`/verify/${row.verifyToken ?? ""}`, request),
    printedAt: new Date().toISOString(),
    printedBy: user.name,
    ...extra,
  };
}
