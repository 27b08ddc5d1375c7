// Whether a register item fits a position of the rigging, judged by the very check the plan will run:
// the editor's solve body with the item put in that position, through the same solve and checks. So
// the picker's note and the plan's check cannot disagree (an eyebolt is judged at its derated capacity
// for the pull's angle, a sling leg by its hitch, each against the design load with contingency).
// Pure and shared with the browser.
import type { GearPick } from "~/plans/rigging";
import { handleSolve } from "~/statics/api";
import type { CheckResult, LegRigging, RiggingDescription } from "~/statics/check-types";
import type { Hitch, ReferenceTables } from "~/statics/reference";

export type PickSlot =
  { role: "eyebolt" | "shackle" | "sling"; legId: string; hitch?: Hitch } | { role: "masterLink" | "crane" };

/** The id of the check that rates the item in this slot. */
export function checkIdFor(slot: PickSlot): string {
  switch (slot.role) {
    case "eyebolt":
      return `eyebolt-${slot.legId}`;
    case "shackle":
      return `shackle-${slot.legId}`;
    case "sling":
      return `sling-leg-${slot.legId}`;
    case "masterLink":
      return "master-link";
    case "crane":
      return "crane-load";
  }
}

type BodyWithRigging = { rigging?: RiggingDescription } & Record<string, unknown>;

/**
 * The plan's check of `pick` in `slot`, given the editor's solve body (null when the layout does not solve
 * or the pick does not belong in the slot).
 */
export function judgePick(
  body: BodyWithRigging | null,
  slot: PickSlot,
  pick: GearPick,
  tables: ReferenceTables,
): CheckResult | null {
  if (!body || pick.spec.role !== slot.role) return null;
  const rigging: RiggingDescription = { ...(body.rigging ?? {}), legs: { ...(body.rigging?.legs ?? {}) } };
  putInSlot(rigging, slot, pick);
  const answer = handleSolve({ ...body, rigging }, tables);
  if (answer.status !== 200) return null;
  return answer.body.checks?.find((c) => c.id === checkIdFor(slot)) ?? null;
}

/** Puts the pick's spec (as the register gives it) in the slot of a copied rigging, as judgePick does. */
function putInSlot(rigging: RiggingDescription, slot: PickSlot, pick: GearPick) {
  const spec = pick.spec;
  if (slot.role === "eyebolt" || slot.role === "shackle" || slot.role === "sling") {
    const leg: LegRigging = { ...(rigging.legs![slot.legId] ?? {}) };
    if (spec.role === "eyebolt") leg.eyebolt = { ...spec.eyebolt };
    else if (spec.role === "shackle") leg.shackle = { ...spec.shackle };
    else if (spec.role === "sling") leg.sling = { ...spec.sling, hitch: slot.hitch ?? leg.sling?.hitch ?? "straight" };
    rigging.legs![slot.legId] = leg;
  } else if (spec.role === "masterLink") {
    rigging.masterLink = { ...spec.masterLink };
  } else if (spec.role === "crane") {
    rigging.crane = { ...spec.crane };
  }
}

/**
 * judgePick for many picks at once, each in its own slot (the items allocated now), from one solve: every
 * slot holds its pick as judgePick puts it there, and each slot's check is read from the same answer. A
 * check rates one position's item, so it comes out as judgePick's one by one. Keyed by checkIdFor(slot).
 */
export function judgePicks(
  body: BodyWithRigging | null,
  placed: ReadonlyArray<{ slot: PickSlot; pick: GearPick }>,
  tables: ReferenceTables,
): Map<string, CheckResult | null> {
  const out = new Map<string, CheckResult | null>();
  const fitting = placed.filter(({ slot, pick }) => body && pick.spec.role === slot.role);
  for (const { slot } of placed) out.set(checkIdFor(slot), null);
  if (!body || fitting.length === 0) return out;
  const rigging: RiggingDescription = { ...(body.rigging ?? {}), legs: { ...(body.rigging?.legs ?? {}) } };
  for (const { slot, pick } of fitting) putInSlot(rigging, slot, pick);
  const answer = handleSolve({ ...body, rigging }, tables);
  if (answer.status !== 200) {
    // One item may stop the solve where the others would not: judge each alone, as the picker would.
    for (const { slot, pick } of fitting) out.set(checkIdFor(slot), judgePick(body, slot, pick, tables));
    return out;
  }
  for (const { slot } of fitting)
    out.set(checkIdFor(slot), answer.body.checks?.find((c) => c.id === checkIdFor(slot)) ?? null);
  return out;
}
