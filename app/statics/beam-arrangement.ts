// A lifting beam arrangement: vertical drops to the load, the beam (with its own mass) hung from
// the hook, and the same checks a bridle gets, under the given rule set. Pure.
import type { ArrangementInput, BeamHanging } from "./arrangement";
import { solveBeamLift } from "./beam";
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

/** Solves a beam arrangement and checks its rigging (the drops' and the hook's). */
export function solveBeamArrangement(
  input: ArrangementInput & { hanging: BeamHanging },
  tables: ReferenceTables,
): ArrangementOutcome {
  const { ruleSet, load, liftPoints: points } = input;
  const { beam, hookZM: hookHeightM } = input.hanging;
  const rigging = input.rigging ?? {};
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
  // The beam hangs level with its drops; its lug is set plumb over the load's CoG (an adjustable lifting beam).
  const beamZ = Math.max(...points.map((p) => p.position.z)) + beam.dropLengthM;
  if (!(hookHeightM > beamZ + 1e-6)) {
    return {
      status: 422,
      body: {
        code: "HOOK_BELOW_BEAM",
        error: `The hook must be above the beam's lug at ${Math.round(beamZ * 1000)} mm (component frame): raise the hook height.`,
      },
    };
  }
  const dropLengths = points.map((p) => beamZ - p.position.z);
  const lug = { x: load.cog.x, y: load.cog.y, z: beamZ };
  const outcome = solveBeamLift(
    load.massKg,
    load.cog,
    points,
    { massKg: beam.massKg, cog: lug, topLugs: [lug] },
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
      angleFromVerticalDeg: 0,
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
  checks.push(
    ratioCheck(
      {
        id: "beam",
        kind: "beam",
        item: "Lifting beam",
        itemCode: null,
        position: { legs: [] },
        rule: "Load with contingency against the beam's marked WLL",
        ruleSet,
        source: "marked WLL of the beam",
        inputs: { wllKg: beam.wllKg },
      },
      designLoadKg,
      beam.wllKg,
      { kind: "larger-item", minWllKg: designLoadKg },
    ),
  );
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
    beam: { massKg: beam.massKg, wllKg: beam.wllKg, hookMassKg: s.hookMassKg, topLegs },
  };
  return { status: 200, body };
}
