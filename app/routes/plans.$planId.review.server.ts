// The review page's reading of a revision in review: the whole plan as it stands, its results worked
// out again as the page opens (inspection dates move, gear changes), every allocated item as the
// register has it now, and each reason the approval would be refused, so the approver reads them
// before being asked for a password.
import { overrideMark } from "~/plans/load-override";
import { getOrganisationToday } from "~/models/organisation.server";
import { listAcknowledgements } from "~/models/plan-acknowledgement.server";
import { getPlan } from "~/models/plan.server";
import { listGearItemsByIds } from "~/models/gear-item.server";
import type { SessionUser } from "~/models/user.server";
import { approvalRefusals, type ReviewGearRow } from "~/plans/approval-readiness";
import type { PlanResults, RiggingAllocation } from "~/plans/document";
import { loadPathGaps } from "~/plans/load-path";
import { judgeLiveState } from "~/plans/live-state";
import { gearNow } from "~/plans/live-state.server";
import { computePlanResults } from "~/plans/results.server";
import { allocatedSlots } from "~/plans/seal.server";
import type { SealedItem } from "~/plans/sealed";
import { getWorkflowView, shownRevision } from "~/plans/workflow-view.server";

function hasAllocatedGear(rigging: RiggingAllocation): boolean {
  return allocatedSlots(rigging).length > 0;
}

/** The allocated gear judged now for a lift on `liftDate`, in schedule order, with the fresh results' loads. */
async function gearNowFor(
  organisationId: number,
  revision: { rigging: RiggingAllocation; arrangement: { kind: string } },
  results: PlanResults,
  liftDate: string,
) {
  const slots = allocatedSlots(revision.rigging, revision.arrangement.kind === "beam" ? "Drop" : "Leg");
  const found = await listGearItemsByIds(
    organisationId,
    slots.map((s) => s.itemId),
  );
  const items = new Map(found.map((i) => [i.id, i]));
  const checks = results.status === 200 ? (results.body.checks ?? []) : [];
  // Judged as if sealed now, so the same sentences as on an approved plan say what is wrong (nothing has "changed").
  const asOfNow: SealedItem[] = slots.map((slot) => {
    const item = items.get(slot.itemId);
    return {
      position: slot.position,
      slot: slot.slot,
      leg: slot.leg,
      itemId: slot.itemId,
      itemCode: item?.itemCode ?? `#${slot.itemId}`,
      kind: item?.kind ?? "",
      description: item?.description ?? "",
      serial: item?.serial ?? "",
      manufacturer: item?.manufacturer ?? "",
      wllKg: item?.wllKg ?? 0,
      wllMarked: item ? `${item.wllValue.toLocaleString("en-GB")} ${item.wllUnit}` : "",
      massKg: item?.beamMassKg ?? null,
      lastExaminedOn: item?.lastExaminedOn ?? null,
      nextDueOn: item?.nextDueOn ?? null,
      certificate: "",
      loadKg: null,
      utilisation: null,
    };
  });
  const now = new Map([...items.values()].map((i) => [i.id, gearNow(i)]));
  const live = judgeLiveState(asOfNow, now, liftDate, new Date().toISOString());
  const rows: ReviewGearRow[] = asOfNow.map((sealed, i) => {
    const item = items.get(sealed.itemId);
    const check = checks.find((c) => c.id === slots[i]!.checkId);
    return {
      position: sealed.position,
      itemId: sealed.itemId,
      itemCode: sealed.itemCode,
      description: sealed.description,
      wllMarked: sealed.wllMarked,
      status: item?.status ?? "missing",
      statusReason: item?.statusReason ?? "",
      nextDueOn: sealed.nextDueOn,
      loadKg: check?.loadKg ?? null,
      utilisation: check?.utilisation ?? null,
      problems: live.problems.filter((p) => p.itemId === sealed.itemId).map((p) => p.message),
    };
  });
  return { rows, problems: live.problems };
}

/** Everything the review page shows, read and worked out now; null when the plan is not the organisation's. */
export async function loadReview(user: SessionUser, planId: number) {
  const organisationId = user.organisationId;
  const found = await getPlan(organisationId, planId);
  if (!found) return null;
  const workflow = (await getWorkflowView(organisationId, found.plan.id, user, found))!;
  const shown = shownRevision(found, workflow);
  const r = found.revision;
  const today = await getOrganisationToday(organisationId);
  const results = await computePlanResults(r.snapshot, r.arrangement, r.rigging, organisationId, today, {
    details: r.details,
  });
  // Nobody lifts in the past: a planned date already gone is judged as today.
  const liftDate = r.details.liftDate && r.details.liftDate > today ? r.details.liftDate : today;
  const gear = await gearNowFor(organisationId, r, results, liftDate);
  const acknowledged = new Set((await listAcknowledgements(r.id)).map((a) => a.checkId));
  const gaps = loadPathGaps(r.snapshot, r.arrangement, r.rigging);
  const approve = workflow.permissions.approve;
  const refusals = approvalRefusals({
    permission: approve.allowed ? { allowed: true } : { allowed: false, reason: approve.reason ?? "" },
    results,
    hasAllocatedGear: hasAllocatedGear(r.rigging),
    loadPathGaps: gaps,
    gearProblems: gear.problems,
    acknowledgedCheckIds: acknowledged,
  });
  return {
    plan: { id: found.plan.id, title: shown.title },
    job: shown.job,
    revision: {
      revision: r.revision,
      status: r.status,
      snapshot: r.snapshot,
      arrangement: r.arrangement,
      rigging: r.rigging,
      details: r.details,
      loadOverride: overrideMark(r.componentSnapshot, r.loadOverride),
      /** Worked out as the page opened, never the stored copy. */
      results,
    },
    liftDate,
    gear: gear.rows,
    acknowledgements: workflow.acknowledgements,
    permissions: { approve, return: workflow.permissions.return },
    refusals,
  };
}
