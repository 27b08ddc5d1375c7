import type { ComponentDefinition } from "~/loads/component-definition";
import { arrangementInput } from "~/plans/arrangement-input";
import type { PlanDetails } from "~/plans/document";
import type { PlanEdit } from "~/plans/editor-state";
import { assembleRigging, fitOf, type GearPick } from "~/plans/rigging";
import { toSolveBody } from "~/statics/api";
import type { RuleSetId } from "~/statics/reference";

/** The /api/solve body for the edit (bridles only), with the rigging assembled from the picks. */
export function solveBodyFor(
  edit: PlanEdit,
  snapshot: ComponentDefinition,
  picks: ReadonlyMap<number, GearPick>,
  details: PlanDetails,
  ruleSet: RuleSetId,
) {
  if (edit.arrangement.kind !== "bridle") return null;
  const underside = Math.min(...snapshot.outlineElevation.map((p) => p[1]));
  const rigging = assembleRigging(edit.rigging, picks, {
    contingencyPct: snapshot.contingencyPct,
    floorClearanceM: details.floorClearanceM,
    loadUndersideZM: underside,
  });
  const input = arrangementInput(
    { massKg: snapshot.massKg, cog: edit.cog, liftPoints: edit.liftPoints },
    edit.arrangement,
    rigging,
    { ruleSet, liftDate: details.liftDate, fit: fitOf(snapshot) },
  );
  return input.liftPoints.length > 0 ? toSolveBody(input) : null;
}
