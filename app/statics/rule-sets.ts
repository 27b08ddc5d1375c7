// Which rules a check applies: the organisation's rule set picks the factors, tables and limits.
// Pure lookups over the reference rows passed in.
import type { EyeboltFamily, LegRigging, SlingSpec } from "./check-types";
import {
  requireRuleSet,
  type EyeboltMethod,
  type Hitch,
  type ReferenceTables,
  type RuleSetId,
  type RuleSetRow,
} from "./reference";

/** The rule set's row (limits, eyebolt methods, examination intervals). */
export function ruleSetRow(tables: ReferenceTables, id: RuleSetId): RuleSetRow {
  return requireRuleSet(tables.ruleSets, id);
}

/** How a rule set rates an eyebolt family at an angle. */
export function eyeboltMethod(row: RuleSetRow, family: EyeboltFamily): EyeboltMethod {
  return family === "collar" ? row.collarEyebolts : family === "shoulder" ? row.shoulderEyebolts : row.plainEyebolts;
}

/**
 * The hitches a sling leg can make, from what the leg attaches to and the sling itself:
 * a leg pinned in an eyebolt or shackle ends there, so it hangs straight; a sling that goes round
 * the load at the lift point can also choke; only a single sling can basket (both ends to the
 * hook), since a leg of a multi-leg sling has one free end. Common practice.
 */
export function allowedHitches(
  sling: Pick<SlingSpec, "kind" | "assemblyLegs">,
  leg: Pick<LegRigging, "eyebolt" | "shackle">,
): Hitch[] {
  if (leg.eyebolt || leg.shackle) return ["straight"];
  const single = (sling.assemblyLegs ?? 1) <= 1;
  return single ? ["straight", "choke", "basket"] : ["straight", "choke"];
}
