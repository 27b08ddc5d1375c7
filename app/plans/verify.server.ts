// What the verify page (the printed QR code's target) says about a revision: whether it is still the
// current approved one, and, for an approved one, whether its gear is fit to lift now. Everything it
// shows of the plan comes from the sealed record.
import { findRevisionByVerifyToken } from "~/models/plan.server";
import type { PlanStatus } from "~/plans/document";
import type { LiveGearState } from "~/plans/live-state";
import { liveStateOf } from "~/plans/live-state.server";
import { fingerprintOf } from "~/plans/seal.server";
import type { LoadOverrideMark } from "~/plans/load-override";
import { readSealed } from "~/plans/sealed";

export type VerifiedRevision = {
  title: string;
  site: string;
  revision: number;
  status: PlanStatus;
  supersededByRevision: number | null;
  approvedAt: string | null;
  approverName: string | null;
  fingerprint: string | null;
  /** The stored record still hashes to the fingerprint printed on the copy. */
  intact: boolean;
  /** The planner's override of the component's mass or CoG, as approved (the printed copy carries it too). */
  loadOverride: LoadOverrideMark | null;
  /** The gear judged now, for a revision that is still the current approved one. */
  live: LiveGearState | null;
  organisationId: number;
  planId: number;
};

/** The revision a printed QR code points at (any organisation: the token itself is the secret). */
export async function verifyRevision(token: string): Promise<VerifiedRevision | null> {
  const found = await findRevisionByVerifyToken(token);
  if (!found) return null;
  const { plan, revision } = found;
  const sealed = readSealed(revision.sealed);
  const live = sealed && revision.status === "approved" ? await liveStateOf(plan.organisationId, sealed) : null;
  return {
    title: sealed?.title ?? "",
    site: sealed ? `${sealed.site.name} (${sealed.site.customer})` : "",
    revision: revision.revision,
    status: revision.status,
    supersededByRevision: revision.supersededByRevision ?? null,
    approvedAt: revision.approvedAt?.toISOString() ?? null,
    approverName: sealed?.approval.name ?? revision.approverName ?? null,
    fingerprint: revision.fingerprint ?? null,
    intact: sealed !== null && fingerprintOf(sealed) === revision.fingerprint,
    loadOverride: sealed?.loadOverride ?? null,
    live,
    organisationId: plan.organisationId,
    planId: plan.id,
  };
}
