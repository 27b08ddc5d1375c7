// Sealing an approved revision: everything its page, print and verify page show is gathered once,
// inside the approval's transaction, into one record; its SHA-256 is the fingerprint.
import { createHash } from "node:crypto";
import type { Transaction } from "sequelize";
import { toGearPick } from "~/gear/picks.server";
import { latestExaminationsOf, type Examination } from "~/models/examination.server";
import { listGearItemsByIds, type GearItem } from "~/models/gear-item.server";
import { getJob } from "~/models/job.server";
import { getOrganisation } from "~/models/organisation.server";
import { listAcknowledgements } from "~/models/plan-acknowledgement.server";
import type { PlanForWorkflow, RevisionView } from "~/models/plan.server";
import { getReferenceTables } from "~/models/reference-row.server";
import { userNames, type SessionUser } from "~/models/user.server";
import type { PlanResultsBody, RiggingAllocation } from "~/plans/document";
import { overrideMark } from "~/plans/load-override";
import type { GearSlot, SealedItem, SealedPlan } from "~/plans/sealed";

/** SHA-256 of a value in a canonical form (object keys sorted), hex. */
export function fingerprintOf(content: unknown): string {
  const canonical = (value: unknown): unknown => {
    if (Array.isArray(value)) return value.map(canonical);
    if (value && typeof value === "object" && !(value instanceof Date)) {
      return Object.fromEntries(
        Object.keys(value)
          .sort()
          .map((k) => [k, canonical((value as Record<string, unknown>)[k])]),
      );
    }
    return value;
  };
  return createHash("sha256")
    .update(JSON.stringify(canonical(content)))
    .digest("hex");
}

type Slot = { position: string; slot: GearSlot; leg: string | null; itemId: number; checkId: string };

/** Every allocated item in schedule order: each leg's eyebolt, shackle and sling, then the master link and the crane. */
export function allocatedSlots(rigging: RiggingAllocation, legWord = "Leg"): Slot[] {
  const slots: Slot[] = [];
  for (const [leg, r] of Object.entries(rigging.legs)) {
    if (r.eyeboltItemId)
      slots.push({
        position: `${legWord} ${leg} eyebolt`,
        slot: "eyebolt",
        leg,
        itemId: r.eyeboltItemId,
        checkId: `eyebolt-${leg}`,
      });
    if (r.shackleItemId)
      slots.push({
        position: `${legWord} ${leg} shackle`,
        slot: "shackle",
        leg,
        itemId: r.shackleItemId,
        checkId: `shackle-${leg}`,
      });
    if (r.slingItemId)
      slots.push({
        position: `${legWord} ${leg} sling`,
        slot: "sling",
        leg,
        itemId: r.slingItemId,
        checkId: `sling-leg-${leg}`,
      });
  }
  if (rigging.masterLinkItemId)
    slots.push({
      position: "Master link",
      slot: "masterLink",
      leg: null,
      itemId: rigging.masterLinkItemId,
      checkId: "master-link",
    });
  if (rigging.craneItemId)
    slots.push({
      position: "Crane or hoist",
      slot: "crane",
      leg: null,
      itemId: rigging.craneItemId,
      checkId: "crane-load",
    });
  if (rigging.beamItemId)
    slots.push({ position: "Lifting beam", slot: "beam", leg: null, itemId: rigging.beamItemId, checkId: "beam" });
  return slots;
}

function certificateText(exam: Examination | undefined) {
  if (!exam) return "No thorough examination on record";
  const file = exam.certificate ? `certificate ${exam.certificate.originalName}` : "no certificate uploaded";
  return `Examined ${exam.examinedOn} by ${exam.examiner} (${exam.result}); ${file}`;
}

function sealedItem(
  slot: Slot,
  item: GearItem | undefined,
  description: string,
  certificate: string,
  results: PlanResultsBody,
): SealedItem {
  const check = (results.checks ?? []).find((c) => c.id === slot.checkId);
  return {
    position: slot.position,
    slot: slot.slot,
    leg: slot.leg,
    itemId: slot.itemId,
    itemCode: item?.itemCode ?? `#${slot.itemId}`,
    kind: item?.kind ?? "",
    description,
    serial: item?.serial ?? "",
    manufacturer: item?.manufacturer ?? "",
    wllKg: item?.wllKg ?? 0,
    wllMarked: item ? `${item.wllValue.toLocaleString("en-GB")} ${item.wllUnit}` : "",
    massKg: item?.beamMassKg ?? null,
    lastExaminedOn: item?.lastExaminedOn ?? null,
    nextDueOn: item?.nextDueOn ?? null,
    certificate,
    loadKg: check?.loadKg ?? null,
    utilisation: check?.utilisation ?? null,
  };
}

export type SealInput = {
  loaded: PlanForWorkflow;
  view: RevisionView;
  results: PlanResultsBody;
  resultsComputedOn: string;
  approver: SessionUser;
  approvedAt: Date;
  comment: string;
  typedName: string;
  selfApproved: boolean;
};

/** The sealed record of the revision being approved, read inside the approval's transaction. */
export async function buildSealedRecord(
  organisationId: number,
  input: SealInput,
  transaction: Transaction,
): Promise<SealedPlan> {
  const { loaded, view, results } = input;
  const organisation = await getOrganisation(organisationId);
  const job = await getJob(organisationId, loaded.plan.jobId, transaction);
  const slots = allocatedSlots(view.rigging, view.arrangement.kind === "beam" ? "Drop" : "Leg");
  const ids = slots.map((s) => s.itemId);
  const items = new Map((await listGearItemsByIds(organisationId, ids, transaction)).map((i) => [i.id, i]));
  const exams = await latestExaminationsOf(organisationId, ids, transaction);
  const tables = await getReferenceTables();
  const acknowledgements = await listAcknowledgements(view.id, transaction);
  const names = await userNames(
    organisationId,
    [view.plannedBy, ...(view.submittedBy ? [view.submittedBy] : []), ...acknowledgements.map((a) => a.userId)],
    transaction,
  );
  const site = job?.site;
  return {
    seal: 1,
    planId: loaded.plan.id,
    organisationName: organisation?.name ?? input.approver.organisationName,
    title: loaded.plan.title,
    site: { name: site?.name ?? "", customer: site?.customer ?? "", address: site?.address ?? "" },
    job: { workOrder: job?.workOrder ?? "", title: job?.title ?? "", startsOn: job?.startsOn ?? null },
    revision: view.revision,
    dates: {
      createdAt: loaded.current.createdAt.toISOString(),
      submittedAt: view.submittedAt ? new Date(view.submittedAt).toISOString() : null,
      approvedAt: input.approvedAt.toISOString(),
    },
    planner: { id: view.plannedBy, name: names.get(view.plannedBy) ?? "unknown" },
    submitter: view.submittedBy ? { id: view.submittedBy, name: names.get(view.submittedBy) ?? "unknown" } : null,
    approval: {
      userId: input.approver.id,
      name: input.approver.name,
      role: "Appointed person",
      approvedAt: input.approvedAt.toISOString(),
      comment: input.comment,
      selfApproved: input.selfApproved,
      typedName: input.typedName.trim(),
    },
    component: { id: view.componentId, version: view.componentVersion },
    snapshot: view.snapshot,
    loadOverride: overrideMark(view.componentSnapshot, view.loadOverride),
    arrangement: view.arrangement,
    rigging: view.rigging,
    results,
    resultsComputedOn: input.resultsComputedOn,
    schedule: slots.map((slot) => {
      const item = items.get(slot.itemId);
      const pick = item ? toGearPick(item, tables) : null;
      return sealedItem(
        slot,
        item,
        pick?.description ?? item?.description ?? "",
        certificateText(exams.get(slot.itemId)),
        results,
      );
    }),
    details: view.details,
    acknowledgements: acknowledgements.map((a) => ({
      checkId: a.checkId,
      checkItem: a.checkItem,
      checkMessage: a.checkMessage,
      reason: a.reason,
      by: names.get(a.userId) ?? "unknown",
      at: a.createdAt.toISOString(),
    })),
  };
}
