// A lifting beam arrangement: vertical drops from the beam's lugs to the load, the beam (with its own mass)
// hung from the hook, and the same checks a bridle gets, under the given rule set. Pure.
import type { ArrangementInput, BeamHanging } from "./arrangement";
import { placeBeamForPlan } from "~/plans/beam-geometry";
import { solveBeamLift } from "./beam";
import type { BeamGeometry } from "./beam-placement";
import type { Check, InspectionRecord } from "./check-types";
import { grossLoads } from "./checks";
import { contingencyFactor, ratioCheck } from "./checks-common";
import { checkEyebolt, checkShackle, shackleSideLoad } from "./checks-fittings";
import { checkCraneLoad, checkHeadroom, checkInspection, checkMasterLink } from "./checks-hook";
import { checkSlingLeg } from "./checks-sling";
import type { ReferenceTables } from "./reference";
import {
  toCheckResult,
  toLegBody,
  uniqueById,
  type ArrangementBody,
  type ArrangementOutcome,
  type SolveLegBody,
} from "./response";
import { allowedHitches } from "./rule-sets";
import { STANDARD_GRAVITY_MS2 } from "./units";

/** The allocated beam as the checks take it: from the register item. */
export type BeamItemSpec = BeamGeometry & {
  itemCode: string;
  kind: "beam" | "spreader";
  massKg: number;
  wllKg: number;
  inspection?: InspectionRecord;
};

/**
 * The beam of a beam arrangement: the drops' length, and the register item allocated; mass, WLL and length
 * typed on a plan made before beams came from the register are used only when no item is given.
 */
export type BeamSpec = {
  dropLengthM: number;
  item?: BeamItemSpec | null;
  massKg?: number;
  wllKg?: number;
  lengthM?: number;
};

/** The beam in use: the register item, else the typed figures (not from the register). */
function beamInUse(spec: BeamSpec) {
  const item = spec.item ?? null;
  if (item) return { ok: true as const, massKg: item.massKg, wllKg: item.wllKg, lengthM: item.lengthM, item };
  if (spec.massKg !== undefined && spec.wllKg !== undefined && spec.lengthM !== undefined)
    return { ok: true as const, massKg: spec.massKg, wllKg: spec.wllKg, lengthM: spec.lengthM, item: null };
  return { ok: false as const };
}

/** Solves a beam arrangement and checks its rigging (the drops' and the hook's). */
export function solveBeamArrangement(
  input: ArrangementInput & { hanging: BeamHanging },
  tables: ReferenceTables,
): ArrangementOutcome {
  const { ruleSet, load, liftPoints: points } = input;
  const { hookZM: hookHeightM } = input.hanging;
  const rigging = input.rigging ?? {};
  const used = beamInUse(input.hanging.beam);
  if (!used.ok)
    return {
      status: 422,
      body: {
        code: "NO_BEAM",
        error: "Allocate the lifting beam or spreader from the register: its mass, WLL and lugs come from there.",
      },
    };
  const beam = { ...used, dropLengthM: input.hanging.beam.dropLengthM };
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
  const placed = placeBeamForPlan(points, load.cog, beam.dropLengthM, beam.item ?? { lengthM: beam.lengthM });
  if (!placed.ok) return { status: 422, body: { error: placed.message, code: placed.code } };
  const placement = placed.placement;
  const beamZ = placement.beamZM;
  if (!(hookHeightM > beamZ + 1e-6)) {
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
    load.massKg,
    load.cog,
    points,
    { massKg: beam.massKg, cog: placement.cog, topLugs: placement.topLugs },
    hookHeightM,
    dropLengths,
  );
  if (!outcome.ok) return { status: 422, body: { error: outcome.message, code: outcome.code } };
  const s = outcome.solution;
  const factor = contingencyFactor(rigging.contingencyPct);
  const legs: SolveLegBody[] = s.drops.drops.map((d, i) => {
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
      const thread = point.thread || undefined;
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
  const designLoadKg = load.massKg * factor;
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
  const loads = grossLoads(load.massKg, rigging, beam.massKg);
  if (rigging.masterLink) {
    checks.push(checkMasterLink(loads.masterLink.kg, rigging.masterLink, { ruleSet, gross: loads.masterLink.gross }));
    if (rigging.masterLink.inspection) inspections.push({ name: "Master link", record: rigging.masterLink.inspection });
  }
  if (rigging.crane) {
    checks.push(checkCraneLoad(loads.crane.kg, rigging.crane, { ruleSet, gross: loads.crane.gross }));
    if (rigging.crane.inspection) inspections.push({ name: "Crane or hoist", record: rigging.crane.inspection });
    if (rigging.crane.maxHookHeightM !== undefined && rigging.headroom) {
      const drop = hookHeightM - (rigging.headroom.loadUndersideZM ?? 0);
      checks.push(
        checkHeadroom(rigging.headroom.clearanceAboveFloorM + drop, rigging.crane.maxHookHeightM, { ruleSet }),
      );
    }
  }
  for (const { name, record } of inspections) {
    checks.push(
      checkInspection(name, record, input.todayIso ?? "", { ruleSet, tables, liftDateIso: input.liftDateIso ?? null }),
    );
  }
  checks.push(...(input.extra?.checks ?? []));
  const unique = uniqueById(checks).map(toCheckResult);
  const dropRating = s.drops.rating;
  const topLegs: SolveLegBody[] = s.top.legs.map(toLegBody);
  const body: ArrangementBody = {
    mode: "level",
    weightKn: (load.massKg * STANDARD_GRAVITY_MS2) / 1000,
    method: s.drops.method,
    hook: { x: s.top.hook.x, y: s.top.hook.y, z: s.top.hook.z },
    tiltDeg: 0,
    legs,
    warnings: [...s.warnings.map((w) => ({ code: w.code, message: w.message })), ...(input.extra?.notes ?? [])],
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
