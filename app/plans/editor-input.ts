// The statics core's input for the plan as the editor holds it, built in the browser from the picks the
// server made of the register: the same input computePlanResults builds from the register items, so the
// editor's live figures come from the same core with the same tables. Pure and shared.
import type { ComponentDefinition } from "~/loads/component-definition";
import { arrangementInput } from "~/plans/arrangement-input";
import type { PlanDetails } from "~/plans/document";
import type { PlanEdit } from "~/plans/editor-state";
import { assembleRigging, fitOf, type GearPick } from "~/plans/rigging";
import type { ArrangementInput, Note } from "~/statics/arrangement";
import type { BeamItemSpec } from "~/statics/beam-arrangement";
import type { Check } from "~/statics/check-types";
import { checkNeverExamined } from "~/statics/checks-hook";
import { findModeFactor, type ReferenceTables, type RuleSetId } from "~/statics/reference";

export type EditorInputContext = {
  picks: ReadonlyMap<number, GearPick>;
  details: Pick<PlanDetails, "floorClearanceM" | "liftDate">;
  ruleSet: RuleSetId;
  /** The organisation's calendar day, YYYY-MM-DD, as the server judges examinations on save. */
  todayIso: string;
  tables: ReferenceTables;
};

/** The planned load: the plan's copy of the component with the mass and CoG the plan lifts. */
export type PlannedLoad = Pick<
  ComponentDefinition,
  "massKg" | "cog" | "contingencyPct" | "outlineElevation" | "fitToleranceDeg" | "fitToleranceSource"
>;

/** A register beam as the beam checks take it, from its pick; null where its lugs are not recorded. */
export function beamItemOfPick(pick: GearPick | undefined): BeamItemSpec | null {
  if (!pick || pick.spec.role !== "beam" || !pick.spec.beam) return null;
  const { kind, lengthM, dropLugsM, topLugsM, massKg } = pick.spec.beam;
  return {
    itemCode: pick.itemCode,
    kind,
    lengthM,
    dropLugsM,
    topLugsM,
    massKg,
    wllKg: pick.wllKg,
    ...(pick.nextDueOn
      ? { inspection: { itemId: pick.itemCode, status: pick.status, examinationDue: pick.nextDueOn } }
      : {}),
  };
}

/**
 * What the server adds about the gear before the solve (plans/results.server.ts describeRigging): a failing
 * inspection check for each item never examined, named as the server names it, and a note for each
 * multi-leg sling whose leg is taken as its marking over the mode factor. Same order as the server's.
 */
function gearExtras(edit: PlanEdit, context: EditorInputContext) {
  const { picks, ruleSet, tables, todayIso, details } = context;
  const checks: Check[] = [];
  const notes: Note[] = [];
  const options = { ruleSet, tables, liftDateIso: details.liftDate || null };
  const unexamined = (pick: GearPick | undefined, name: string, role: GearPick["role"]) => {
    if (pick && pick.spec.role === role && !pick.nextDueOn)
      checks.push(checkNeverExamined(name, pick.itemCode, todayIso, options));
  };
  const noted = new Set<number>();
  for (const [leg, r] of Object.entries(edit.rigging.legs)) {
    unexamined(r.eyeboltItemId !== undefined ? picks.get(r.eyeboltItemId) : undefined, `Eyebolt at ${leg}`, "eyebolt");
    unexamined(r.shackleItemId !== undefined ? picks.get(r.shackleItemId) : undefined, `Shackle at ${leg}`, "shackle");
    const sling = r.slingItemId !== undefined ? picks.get(r.slingItemId) : undefined;
    if (sling?.spec.role === "sling" && sling.spec.sling.assemblyWll && !noted.has(sling.id)) {
      const legCount = sling.spec.sling.assemblyLegs ?? 1;
      const mode = findModeFactor(tables.modeFactors, legCount === 2 ? 2 : 3, 45, ruleSet);
      if (mode) {
        noted.add(sling.id);
        notes.push({
          code: "SLING_LEG_FROM_ASSEMBLY",
          message: `${sling.itemCode} is a ${legCount}-leg sling; each leg is taken as its marked WLL over the mode factor ${mode.factor} (${mode.source}).`,
        });
      }
    }
    unexamined(sling, `Sling leg ${leg}`, "sling");
  }
  const { masterLinkItemId, craneItemId, beamItemId } = edit.rigging;
  unexamined(masterLinkItemId !== undefined ? picks.get(masterLinkItemId) : undefined, "Master link", "masterLink");
  unexamined(craneItemId !== undefined ? picks.get(craneItemId) : undefined, "Crane or hoist", "crane");
  if (edit.arrangement.kind === "beam" && beamItemId !== undefined) {
    const beam = picks.get(beamItemId);
    const spec = beamItemOfPick(beam);
    if (beam && spec && !spec.inspection)
      checks.push(
        checkNeverExamined(
          spec.kind === "spreader" ? "Spreader beam" : "Lifting beam",
          beam.itemCode,
          todayIso,
          options,
        ),
      );
  }
  return { checks, notes };
}

/** The core's input for the edit: bridle or beam, with the rigging assembled from the picks. */
export function editorArrangementInput(
  edit: PlanEdit,
  load: PlannedLoad,
  context: EditorInputContext,
): ArrangementInput {
  const zs = load.outlineElevation.map((p) => p[1]);
  const rigging = assembleRigging(edit.rigging, context.picks, {
    contingencyPct: load.contingencyPct,
    floorClearanceM: context.details.floorClearanceM,
    loadUndersideZM: zs.length ? Math.min(...zs) : 0,
  });
  const beamItem =
    edit.arrangement.kind === "beam" && edit.rigging.beamItemId !== undefined
      ? beamItemOfPick(context.picks.get(edit.rigging.beamItemId))
      : null;
  return arrangementInput(
    { massKg: load.massKg, cog: load.cog, liftPoints: edit.liftPoints },
    edit.arrangement,
    rigging,
    {
      ruleSet: context.ruleSet,
      todayIso: context.todayIso,
      liftDate: context.details.liftDate,
      extra: gearExtras(edit, context),
      fit: fitOf(load),
      beamItem,
    },
  );
}
