// A plan's results for a lifting beam: vertical drops to the load, the beam (with its own mass) hung
// from the hook, and the same checks a bridle gets, under the organisation's rule set. Pure.
import type { Arrangement, PlanLeg, PlanResultsBody } from "~/plans/document";
import type { ComponentDefinition } from "~/loads/component-definition";
import { toCheckResult } from "~/statics/api";
import { solveBeamLift } from "~/statics/beam";
import type { BeamGeometry } from "~/statics/beam-placement";
import { placeBeamForPlan } from "~/plans/beam-geometry";
import type { LiftPoint } from "~/statics/bridle";
import type { Check, InspectionRecord, RiggingDescription } from "~/statics/check-types";
import { grossLoads } from "~/statics/checks";
import { contingencyFactor, ratioCheck } from "~/statics/checks-common";
import { checkEyebolt, checkShackle, shackleSideLoad } from "~/statics/checks-fittings";
import { checkCraneLoad, checkHeadroom, checkInspection, checkMasterLink } from "~/statics/checks-hook";
import { checkSlingLeg } from "~/statics/checks-sling";
import type { ReferenceTables, RuleSetId } from "~/statics/reference";
import { allowedHitches } from "~/statics/rule-sets";
import { STANDARD_GRAVITY_MS2 } from "~/statics/units";

/** One check per id: a multi-leg sling on several legs is inspected once. */
export function uniqueById<T extends { id: string }>(items: T[]): T[] {
  const seen = new Set<string>();
  return items.filter((c) => (seen.has(c.id) ? false : (seen.add(c.id), true)));
}

type BeamOutcome = { status: 200; body: PlanResultsBody } | { status: 422; body: { error: string; code: string } };

/** The allocated beam as the checks take it: from the register item. */
export type BeamItemSpec = BeamGeometry & {
  itemCode: string;
  kind: "beam" | "spreader";
  massKg: number;
  wllKg: number;
  inspection?: InspectionRecord;
};

/** The beam the plan uses: the register item, else the figures typed on a plan made before (not from the register). */
function beamInUse(arrangement: Arrangement, item: BeamItemSpec | null) {
  if (item) return { ok: true as const, massKg: item.massKg, wllKg: item.wllKg, lengthM: item.lengthM, item };
  const typed = arrangement.beam;
  if (typed?.massKg !== undefined && typed.wllKg !== undefined && typed.lengthM !== undefined)
    return { ok: true as const, massKg: typed.massKg, wllKg: typed.wllKg, lengthM: typed.lengthM, item: null };
  return { ok: false as const };
}

export function beamResults(
  snapshot: ComponentDefinition,
  arrangement: Arrangement,
  rigging: RiggingDescription,
  extraChecks: Check[],
  notes: Array<{ code: string; message: string }>,
  tables: ReferenceTables,
  context: { todayIso: string; ruleSet: RuleSetId; liftDateIso: string | null; beamItem?: BeamItemSpec | null },
): BeamOutcome {
  const { ruleSet } = context;
  const used = beamInUse(arrangement, context.beamItem ?? null);
  if (!used.ok)
    return {
      status: 422,
      body: {
        code: "NO_BEAM",
        error: "Allocate the lifting beam or spreader from the register: its mass, WLL and lugs come from there.",
      },
    };
  const beam = { ...used, dropLengthM: arrangement.beam!.dropLengthM };
  const byLabel = new Map(snapshot.liftPoints.map((p) => [p.label, p]));
  const chosen = arrangement.liftPointLabels.map((l) => byLabel.get(l)!);
  const points: LiftPoint[] = chosen.map((p) => {
    const n = Math.hypot(p.axis.x, p.axis.y, p.axis.z) || 1;
    return { id: p.label, position: p.position, axis: { x: p.axis.x / n, y: p.axis.y / n, z: p.axis.z / n } };
  });
  const span = Math.max(
    0,
    ...points.flatMap((a) => points.map((b) => Math.hypot(a.position.x - b.position.x, a.position.y - b.position.y))),
  );
  if (span > beam.lengthM + 1e-6) {
    return {
      status: 422,
      body: {
        code: "BEAM_TOO_SHORT",
        error: `The lift points are ${Math.round(span * 1000)} mm apart but the beam is ${Math.round(beam.lengthM * 1000)} mm long: use a longer beam or other lift points.`,
      },
    };
  }
  const placed = placeBeamForPlan(points, snapshot.cog, beam.dropLengthM, beam.item ?? { lengthM: beam.lengthM });
  if (!placed.ok) return { status: 422, body: { error: placed.message, code: placed.code } };
  const placement = placed.placement;
  const beamZ = placement.beamZM;
  if (!(arrangement.hookHeightM > beamZ + 1e-6)) {
    return {
      status: 422,
      body: {
        code: "HOOK_BELOW_BEAM",
        error: `The hook must be above the beam's lug at ${Math.round(beamZ * 1000)} mm (component frame): raise the hook height.`,
      },
    };
  }
  const dropLengths = placement.drops.map((d) => d.lengthM);
  const outcome = solveBeamLift(
    snapshot.massKg,
    snapshot.cog,
    points,
    { massKg: beam.massKg, cog: placement.cog, topLugs: placement.topLugs },
    arrangement.hookHeightM,
    dropLengths,
  );
  if (!outcome.ok) return { status: 422, body: { error: outcome.message, code: outcome.code } };
  const s = outcome.solution;
  const factor = contingencyFactor(rigging.contingencyPct);
  const legs: PlanLeg[] = s.drops.drops.map((d, i) => {
    const axis = points[i]!.axis;
    return {
      liftPointId: d.liftPointId,
      lengthM: dropLengths[i]!,
      tensionKn: d.tensionKn,
      tensionKg: d.tensionKg,
      angleFromVerticalDeg: placement.drops[i]!.angleFromVerticalDeg,
      axisAngleDeg: (Math.acos(Math.max(-1, Math.min(1, axis.z))) * 180) / Math.PI,
      verticalShare: d.share,
      slack: d.slack,
    };
  });
  const checks: Check[] = [];
  const inspections: Array<{ name: string; record: InspectionRecord }> = [];
  const up = { x: 0, y: 0, z: 1 };
  points.forEach((point, i) => {
    const leg = legs[i]!;
    const lr = rigging.legs?.[leg.liftPointId];
    if (!lr) return;
    // Each drop is rated for its design tension (lever rule, or the worst state with a drop slack), not its elastic share.
    const loadKg = (s.drops.rating.legs[i]?.designTensionKg ?? leg.tensionKg) * factor;
    if (lr.sling) {
      checks.push(
        checkSlingLeg(leg.liftPointId, loadKg, lr.sling, tables, {
          ruleSet,
          allowedHitches: allowedHitches(lr.sling, lr),
        }),
      );
      if (lr.sling.inspection) inspections.push({ name: `Sling leg ${leg.liftPointId}`, record: lr.sling.inspection });
    }
    if (lr.shackle) {
      const sideLoad = shackleSideLoad(up, point.axis, lr.eyePlane, lr.eyebolt, leg.axisAngleDeg);
      checks.push(checkShackle(leg.liftPointId, loadKg, lr.shackle, tables, { ruleSet, sideLoad }));
      if (lr.shackle.inspection)
        inspections.push({ name: `Shackle at ${leg.liftPointId}`, record: lr.shackle.inspection });
    }
    if (lr.eyebolt) {
      const thread = byLabel.get(leg.liftPointId)?.thread || undefined;
      checks.push(
        checkEyebolt(leg.liftPointId, loadKg, leg.axisAngleDeg, lr.eyebolt, thread, tables, {
          ruleSet,
          geometry: { pull: up, axis: point.axis, plane: lr.eyePlane },
        }),
      );
      if (lr.eyebolt.inspection)
        inspections.push({ name: `Eyebolt at ${leg.liftPointId}`, record: lr.eyebolt.inspection });
    }
  });
  const designLoadKg = snapshot.massKg * factor;
  const beamName = beam.item ? (beam.item.kind === "spreader" ? "Spreader beam" : "Lifting beam") : "Lifting beam";
  checks.push(
    ratioCheck(
      {
        id: "beam",
        kind: "beam",
        item: beam.item ? beamName : "Lifting beam (typed on the plan, not from the register)",
        itemCode: beam.item?.itemCode ?? null,
        position: { legs: [] },
        rule: "Load with contingency against the beam's marked WLL",
        ruleSet,
        source: beam.item
          ? "marked WLL of the beam (register); LOLER reg 8 / ASME B30.20 (common practice)"
          : "WLL typed on the plan, not from the register",
        inputs: { wllKg: beam.wllKg },
      },
      designLoadKg,
      beam.wllKg,
      { kind: "larger-item", minWllKg: designLoadKg },
    ),
  );
  if (beam.item?.inspection) inspections.push({ name: beamName, record: beam.item.inspection });
  const loads = grossLoads(snapshot.massKg, rigging, beam.massKg);
  if (rigging.masterLink) {
    checks.push(checkMasterLink(loads.masterLink.kg, rigging.masterLink, { ruleSet, gross: loads.masterLink.gross }));
    if (rigging.masterLink.inspection) inspections.push({ name: "Master link", record: rigging.masterLink.inspection });
  }
  if (rigging.crane) {
    checks.push(checkCraneLoad(loads.crane.kg, rigging.crane, { ruleSet, gross: loads.crane.gross }));
    if (rigging.crane.inspection) inspections.push({ name: "Crane or hoist", record: rigging.crane.inspection });
    if (rigging.crane.maxHookHeightM !== undefined && rigging.headroom) {
      const drop = arrangement.hookHeightM - (rigging.headroom.loadUndersideZM ?? 0);
      checks.push(
        checkHeadroom(rigging.headroom.clearanceAboveFloorM + drop, rigging.crane.maxHookHeightM, { ruleSet }),
      );
    }
  }
  for (const { name, record } of inspections) {
    checks.push(checkInspection(name, record, context.todayIso, { ruleSet, tables, liftDateIso: context.liftDateIso }));
  }
  checks.push(...extraChecks);
  const unique = uniqueById(checks).map(toCheckResult);
  const dropRating = s.drops.rating;
  const topLegs: PlanLeg[] = s.top.legs.map((l) => ({
    liftPointId: l.liftPointId,
    lengthM: l.lengthM,
    tensionKn: l.tensionKn,
    tensionKg: l.tensionKg,
    angleFromVerticalDeg: l.angleFromVerticalDeg,
    axisAngleDeg: l.axisAngleDeg,
    verticalShare: l.verticalShare,
    slack: l.slack,
  }));
  const body: PlanResultsBody = {
    mode: "level",
    weightKn: (snapshot.massKg * STANDARD_GRAVITY_MS2) / 1000,
    method: s.drops.method,
    hook: { x: s.top.hook.x, y: s.top.hook.y, z: s.top.hook.z },
    tiltDeg: 0,
    legs,
    warnings: [...s.warnings.map((w) => ({ code: w.code, message: w.message })), ...notes],
    rating: dropRating,
    ruleSet,
    checks: unique,
    beam: {
      massKg: beam.massKg,
      wllKg: beam.wllKg,
      hookMassKg: s.hookMassKg,
      topLegs,
      ...(beam.item ? { itemCode: beam.item.itemCode } : {}),
      placement,
    },
  };
  return { status: 200, body };
}
