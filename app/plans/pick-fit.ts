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
  const answer = handleSolve({ ...body, rigging }, tables);
  if (answer.status !== 200) return null;
  return answer.body.checks?.find((c) => c.id === checkIdFor(slot)) ?? null;
}
