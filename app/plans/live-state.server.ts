import { getOrganisationToday } from "~/models/organisation.server";
// The gear's state now, read from the register, beside an approved revision's sealed record; and the
// mail to the people of an approved plan when a change to an item it allocates makes it unfit.
import type { Transaction } from "sequelize";
import { listGearItemsByIds, type GearItem } from "~/models/gear-item.server";
import { listApprovedRevisions, planExists, type PlanRevision } from "~/models/plan.server";
import { listItemIdsInApprovedRevisions, listRevisionIdsUsingItems } from "~/models/plan-revision-item.server";
import { listActiveUsersByIds } from "~/models/user.server";
import { judgeLiveState, type GearNow, type LiveGearState, type LiveProblem } from "~/plans/live-state";
import { mailNotFitToLift } from "~/plans/notifications.server";
import { readSealed, type SealedPlan } from "~/plans/sealed";

export function gearNow(item: GearItem): GearNow {
  return {
    id: item.id,
    itemCode: item.itemCode,
    kind: item.kind,
    serial: item.serial,
    manufacturer: item.manufacturer,
    wllKg: item.wllKg,
    massKg: item.beamMassKg ?? null,
    status: item.status,
    statusReason: item.statusReason,
    statusChangedAt: item.statusChangedAt ? item.statusChangedAt.toISOString() : null,
    nextDueOn: item.nextDueOn ?? null,
    updatedAt: item.updatedAt.toISOString(),
  };
}

/**
 * The day a lift to the plan is judged for when it is looked at: its planned lift date when that is still
 * ahead, else the organisation's today (nobody lifts in the past). Recording the lift judges the day it was made.
 */
export async function liftDateOf(organisationId: number, sealed: SealedPlan): Promise<string> {
  const today = await getOrganisationToday(organisationId);
  const planned = sealed.details.liftDate;
  return planned && planned > today ? planned : today;
}

/** Every allocated item of the sealed record judged against the register now. */
export async function liveStateOf(
  organisationId: number,
  sealed: SealedPlan,
  options: { liftDate?: string; transaction?: Transaction } = {},
): Promise<LiveGearState> {
  const items = await listGearItemsByIds(
    organisationId,
    sealed.schedule.map((s) => s.itemId),
    options.transaction,
  );
  const now = new Map(items.map((i) => [i.id, gearNow(i)]));
  return judgeLiveState(
    sealed.schedule,
    now,
    options.liftDate ?? (await liftDateOf(organisationId, sealed)),
    new Date().toISOString(),
  );
}

type Watched = { revision: PlanRevision; sealed: SealedPlan; problems: LiveProblem[] };

/** The organisation's approved revisions whose sealed record allocates any of the items, each judged now. */
async function watchedRevisions(organisationId: number, itemIds: readonly number[]): Promise<Watched[]> {
  const revisions = await listApprovedRevisions(await listRevisionIdsUsingItems(itemIds));
  const watched: Watched[] = [];
  for (const revision of revisions) {
    const sealed = readSealed(revision.sealed);
    // Only the organisation's own items are ever read, so another organisation's plan is left alone.
    if (!sealed || !(await planExists(organisationId, revision.planId))) continue;
    watched.push({ revision, sealed, problems: (await liveStateOf(organisationId, sealed)).problems });
  }
  return watched;
}

// A new kind of trouble with an item is news; a further edit of an item already changed is not.
const key = (p: LiveProblem) => `${p.itemId}:${p.kind}`;

/**
 * Runs a change to gear items (status, defect, examination, edit, import) and then mails the planner,
 * the appointed person and the assigned rigger of every approved plan that allocates one of them and
 * has a new kind of problem with it after the change. The change's own result is returned as it came.
 */
export async function watchAllocatedGear<T>(
  organisationId: number,
  itemIds: number | "every allocated item",
  change: () => Promise<T>,
  request?: Request,
): Promise<T> {
  const ids = typeof itemIds === "number" ? [itemIds] : await listItemIdsInApprovedRevisions(organisationId);
  const watchedIds = new Set(ids);
  const before = new Map(
    (await watchedRevisions(organisationId, ids)).map((w) => [w.revision.id, new Set(w.problems.map(key))]),
  );
  const result = await change();
  for (const w of await watchedRevisions(organisationId, ids)) {
    const had = before.get(w.revision.id) ?? new Set<string>();
    const fresh = w.problems.filter((p) => watchedIds.has(p.itemId) && !had.has(key(p)));
    if (fresh.length === 0) continue;
    const to = await listActiveUsersByIds(organisationId, [
      w.sealed.planner.id,
      w.sealed.approval.userId,
      ...(w.revision.assignedRiggerId ? [w.revision.assignedRiggerId] : []),
    ]);
    await mailNotFitToLift(
      organisationId,
      to,
      { id: w.sealed.planId, title: w.sealed.title, revision: w.sealed.revision },
      w.problems,
      request,
    );
  }
  return result;
}
