import type { ComponentDefinition } from "~/loads/component-definition";
import type { PlanDetails } from "~/plans/document";
import type { PlanEdit } from "~/plans/editor-state";
import { assembleRigging, fitOf, type GearPick } from "~/plans/rigging";
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
  const byLabel = new Map(edit.liftPoints.map((p) => [p.label, p]));
  const liftPoints = edit.arrangement.liftPointLabels
    .map((label) => byLabel.get(label))
    .filter((p) => p !== undefined)
    .map((p) => ({ id: p.label, ...p.position, axis: p.axis, ...(p.thread ? { thread: p.thread } : {}) }));
  if (liftPoints.length === 0) return null;
  const underside = Math.min(...snapshot.outlineElevation.map((p) => p[1]));
  return {
    load: { massKg: snapshot.massKg, cog: edit.cog },
    liftPoints,
    ...(edit.arrangement.mode === "level"
      ? { hook: { z: edit.arrangement.hookHeightM } }
      : {
          legLengths: Object.fromEntries(
            edit.arrangement.liftPointLabels.map((l) => [l, edit.arrangement.legLengthsM[l] ?? 0]),
          ),
        }),
    rigging: assembleRigging(edit.rigging, picks, {
      contingencyPct: snapshot.contingencyPct,
      floorClearanceM: details.floorClearanceM,
      loadUndersideZM: underside,
    }),
    fit: fitOf(snapshot),
    ruleSet,
    ...(details.liftDate ? { liftDate: details.liftDate } : {}),
  };
}
