// Checks of every item in the load path against its working load limit, under the organisation's
// rule set. Pure: reference tables, the rule set and "today" come in as parameters; nothing here
// reads data or the clock, and nothing here writes a sentence (see app/plans/check-text.ts).
import type { BridleSolution } from "./bridle";
import type { Check, GrossLoad, InspectionRecord, LiftPointInfo, RiggingDescription, SlingSpec } from "./check-types";
import { contingencyFactor } from "./checks-common";
import { checkEyebolt, checkShackle, checkSharedShackle, shackleSideLoad } from "./checks-fittings";
import { checkCraneLoad, checkHeadroom, checkInspection, checkMasterLink } from "./checks-hook";
import { angleFix, checkLegAngle, checkSlingAssembly, checkSlingLeg } from "./checks-sling";
import { DEFAULT_RULE_SET, type ReferenceTables, type RuleSetId } from "./reference";
import { allowedHitches, ruleSetRow } from "./rule-sets";
import type { Vec3 } from "./vector";

export type {
  Check,
  CheckInputs,
  CheckKind,
  CheckResult,
  CheckStatus,
  CraneSpec,
  EyeboltFamily,
  EyeboltSpec,
  EyePlane,
  Finding,
  Fix,
  GrossLoad,
  HeadroomSpec,
  InspectionRecord,
  ItemStatus,
  LegRigging,
  LiftPointInfo,
  MasterLinkSpec,
  RiggingDescription,
  ShackleSpec,
  SharedShackleSpec,
  SlingSpec,
  Verdict,
  Wll,
} from "./check-types";
export { contingencyFactor, isoDateToDay, statedWllKg } from "./checks-common";
export { checkEyebolt, checkShackle, checkSharedShackle, MAX_SHACKLE_INCLUDED_DEG } from "./checks-fittings";
export {
  checkCraneLoad,
  checkHeadroom,
  checkInspection,
  checkNeverExamined,
  EXAMINATION_WARN_DAYS,
} from "./checks-hook";
export {
  checkLegAngle,
  checkSlingAssembly,
  checkSlingLeg,
  describeSling,
  MAX_LEG_DEG,
  resolveSlingWll,
  VERTICAL_LEG_DEG,
  WARN_LEG_DEG,
} from "./checks-sling";
export { checkMasterLink };

export interface CheckOptions {
  ruleSet?: RuleSetId;
  /** The planned lift date, YYYY-MM-DD: inspections are judged against it as well as today. */
  liftDateIso?: string | null;
  /** The beam's mass, kg, where a beam hangs between hook and load. */
  beamMassKg?: number;
}

/** Every taut leg's angle against the rule set's limits, with the hook height or leg lengths that fix it. */
export function angleChecks(
  solution: BridleSolution,
  tables: ReferenceTables,
  ruleSet: RuleSetId = DEFAULT_RULE_SET,
): Check[] {
  const rules = ruleSetRow(tables, ruleSet);
  const limits = { verticalDeg: rules.verticalDeg, warnDeg: rules.warnDeg, maxDeg: rules.maxDeg };
  const taut = solution.legs.filter((l) => !l.slack);
  const worst = Math.max(0, ...taut.map((l) => l.angleFromVerticalDeg));
  const fix =
    worst > limits.warnDeg
      ? { warn: angleFix(solution, limits.warnDeg), fail: angleFix(solution, limits.maxDeg) }
      : undefined;
  return taut.map((leg) =>
    checkLegAngle(leg.liftPointId, leg.angleFromVerticalDeg, {
      ruleSet,
      limits,
      source: rules.angleSource,
      mode: solution.mode,
      fix,
    }),
  );
}

/**
 * What the hook and the crane carry, kg: the load with contingency, every item's own mass (each item
 * once, by its code), the caller's lump sum for rigging, and a beam. Items without a recorded mass
 * are listed (unless a lump sum covers the rigging).
 */
export function grossLoads(massKg: number, rigging: RiggingDescription, beamMassKg = 0) {
  const contingencyPct = rigging.contingencyPct ?? 0;
  const loadWithContingencyKg = massKg * contingencyFactor(contingencyPct);
  const seen = new Set<string>();
  const below: GrossLoad["items"] = [];
  const unrecorded: string[] = [];
  const add = (list: GrossLoad["items"], item: string, spec: { itemCode?: string; massKg?: number }) => {
    if (spec.itemCode !== undefined) {
      if (seen.has(spec.itemCode)) return;
      seen.add(spec.itemCode);
    }
    if (spec.massKg === undefined) unrecorded.push(spec.itemCode ? `${item} (${spec.itemCode})` : item);
    else list.push({ item, code: spec.itemCode ?? null, massKg: spec.massKg });
  };
  for (const [leg, r] of Object.entries(rigging.legs ?? {})) {
    if (r.eyebolt) add(below, `Eyebolt at ${leg}`, r.eyebolt);
    if (r.shackle) add(below, `Shackle at ${leg}`, r.shackle);
    if (r.sling) add(below, `Sling leg ${leg}`, r.sling);
  }
  for (const s of rigging.sharedShackles ?? []) add(below, `Shackle joining legs ${s.legIds[0]} and ${s.legIds[1]}`, s);
  const riggingMassKg = rigging.riggingMassKg ?? 0;
  const sum = (items: GrossLoad["items"]) => items.reduce((total, i) => total + i.massKg, 0);
  // A lump sum stands for whatever rigging has no mass of its own.
  const missing = rigging.riggingMassKg !== undefined ? [] : unrecorded;
  const atLink: GrossLoad = {
    massKg,
    contingencyPct,
    loadWithContingencyKg,
    items: below,
    unrecorded: [...missing],
    riggingMassKg,
    beamMassKg,
  };
  const withLink = [...below];
  if (rigging.masterLink) add(withLink, "Master link", rigging.masterLink);
  const atCrane: GrossLoad = {
    ...atLink,
    items: withLink,
    unrecorded: rigging.riggingMassKg !== undefined ? [] : [...unrecorded],
  };
  return {
    masterLink: { kg: loadWithContingencyKg + sum(below) + riggingMassKg + beamMassKg, gross: atLink },
    crane: { kg: loadWithContingencyKg + sum(withLink) + riggingMassKg + beamMassKg, gross: atCrane },
  };
}

/**
 * The checks of one leg's own items (sling leg, shackle, eyebolt, in that order) under the leg's design
 * tension with contingency, the sling as the assembly rates it and the items' inspection records; null
 * for a leg without rigging.
 */
function legItemChecks(
  solution: BridleSolution,
  i: number,
  liftPoints: ReadonlyArray<LiftPointInfo & { axis?: Vec3 }>,
  rigging: RiggingDescription,
  tables: ReferenceTables,
  ruleSet: RuleSetId,
) {
  const leg = solution.legs[i]!;
  const id = leg.liftPointId;
  const legsRigging = rigging.legs ?? {};
  const lr = Object.hasOwn(legsRigging, id) ? legsRigging[id] : undefined;
  if (!lr) return null;
  const legLoadKg =
    (solution.rating.legs[i]?.designTensionKg ?? leg.tensionKg) * contingencyFactor(rigging.contingencyPct);
  const checks: Check[] = [];
  const inspections: Array<{ name: string; record: InspectionRecord }> = [];
  let slingSpec: SlingSpec | null = null;
  const point = liftPoints.find((p) => p.id === id);
  const axis = point?.axis ?? { x: 0, y: 0, z: 1 };
  if (lr.sling) {
    const allowed = allowedHitches(lr.sling, lr);
    // A hitch that cannot be made earns no factor in the sling's rating either.
    slingSpec = allowed.includes(lr.sling.hitch) ? lr.sling : { ...lr.sling, hitch: "straight" };
    checks.push(checkSlingLeg(id, legLoadKg, lr.sling, tables, { ruleSet, allowedHitches: allowed }));
    if (lr.sling.inspection) inspections.push({ name: `Sling leg ${id}`, record: lr.sling.inspection });
  }
  if (lr.shackle) {
    const sideLoad = shackleSideLoad(leg.direction, axis, lr.eyePlane, lr.eyebolt, leg.axisAngleDeg);
    checks.push(checkShackle(id, legLoadKg, lr.shackle, tables, { ruleSet, sideLoad }));
    if (lr.shackle.inspection) inspections.push({ name: `Shackle at ${id}`, record: lr.shackle.inspection });
  }
  if (lr.eyebolt) {
    checks.push(
      checkEyebolt(id, legLoadKg, leg.axisAngleDeg, lr.eyebolt, point?.thread, tables, {
        ruleSet,
        geometry: { pull: leg.direction, axis, plane: lr.eyePlane },
      }),
    );
    if (lr.eyebolt.inspection) inspections.push({ name: `Eyebolt at ${id}`, record: lr.eyebolt.inspection });
  }
  return { checks, inspections, slingSpec };
}

/**
 * The check of one leg item (id "sling-leg-A", "shackle-A", "eyebolt-A") exactly as checkRigging has it for
 * the same solution and rigging, worked out without the rest: a search that asks after one item's verdict
 * at many hook heights runs this instead of every check.
 */
export function checkLegItem(
  solution: BridleSolution,
  liftPoints: ReadonlyArray<LiftPointInfo & { axis?: Vec3 }>,
  rigging: RiggingDescription,
  tables: ReferenceTables,
  checkId: string,
  ruleSet: RuleSetId = DEFAULT_RULE_SET,
): Check | undefined {
  for (let i = 0; i < solution.legs.length; i++) {
    const id = solution.legs[i]!.liftPointId;
    if (checkId !== `sling-leg-${id}` && checkId !== `shackle-${id}` && checkId !== `eyebolt-${id}`) continue;
    const found = legItemChecks(solution, i, liftPoints, rigging, tables, ruleSet)?.checks.find(
      (c) => c.id === checkId,
    );
    if (found) return found;
  }
  return undefined;
}

/**
 * Every check for a solved bridle and its rigging description. Leg loads use the rating's design
 * tensions (elastic or rule, whichever is larger) times the contingency factor.
 */
export function checkRigging(
  solution: BridleSolution,
  massKg: number,
  cog: Vec3,
  liftPoints: ReadonlyArray<LiftPointInfo & { axis?: Vec3 }>,
  rigging: RiggingDescription,
  tables: ReferenceTables,
  todayIso?: string,
  options: CheckOptions = {},
): Check[] {
  const ruleSet = options.ruleSet ?? DEFAULT_RULE_SET;
  const rules = ruleSetRow(tables, ruleSet);
  const results: Check[] = angleChecks(solution, tables, ruleSet);
  const factor = contingencyFactor(rigging.contingencyPct);
  const inspections: Array<{ name: string; record: InspectionRecord }> = [];
  const slingSpecs: SlingSpec[] = [];
  for (let i = 0; i < solution.legs.length; i++) {
    const items = legItemChecks(solution, i, liftPoints, rigging, tables, ruleSet);
    if (!items) continue;
    if (items.slingSpec) slingSpecs.push(items.slingSpec);
    results.push(...items.checks);
    inspections.push(...items.inspections);
  }
  if (solution.legs.length >= 2 && slingSpecs.length === solution.legs.length) {
    const { rating } = solution;
    results.push(
      checkSlingAssembly(
        massKg * factor,
        slingSpecs,
        rating.effectiveLegs,
        rating.maxAngleFromVerticalDeg,
        rating.rule,
        tables,
        {
          ruleSet,
          angleFix: angleFix(solution, rules.maxDeg),
        },
      ),
    );
  }
  (rigging.sharedShackles ?? []).forEach((s, index) => {
    const a = solution.legs.find((l) => l.liftPointId === s.legIds[0]);
    const b = solution.legs.find((l) => l.liftPointId === s.legIds[1]);
    if (a && b)
      results.push(checkSharedShackle(index, a, b, factor, s, { ruleSet, maxIncludedDeg: rules.sharedShackleMaxDeg }));
    if (s.inspection)
      inspections.push({ name: `Shackle joining legs ${s.legIds[0]} and ${s.legIds[1]}`, record: s.inspection });
  });
  const loads = grossLoads(massKg, rigging, options.beamMassKg ?? 0);
  if (rigging.masterLink) {
    results.push(checkMasterLink(loads.masterLink.kg, rigging.masterLink, { ruleSet, gross: loads.masterLink.gross }));
    if (rigging.masterLink.inspection) inspections.push({ name: "Master link", record: rigging.masterLink.inspection });
  }
  if (rigging.crane) {
    results.push(checkCraneLoad(loads.crane.kg, rigging.crane, { ruleSet, gross: loads.crane.gross }));
    if (rigging.crane.inspection) inspections.push({ name: "Crane or hoist", record: rigging.crane.inspection });
    if (rigging.crane.maxHookHeightM !== undefined && rigging.headroom) {
      const underside = { x: cog.x, y: cog.y, z: rigging.headroom.loadUndersideZM ?? 0 };
      const h = solution.hook;
      const v = solution.vertical;
      // Vertical distance from the load's underside (below the CoG) up to the hook point.
      const drop = (h.x - underside.x) * v.x + (h.y - underside.y) * v.y + (h.z - underside.z) * v.z;
      results.push(
        checkHeadroom(rigging.headroom.clearanceAboveFloorM + drop, rigging.crane.maxHookHeightM, {
          ruleSet,
          ...(rigging.crane.itemCode ? { itemCode: rigging.crane.itemCode } : {}),
        }),
      );
    }
  }
  if (todayIso !== undefined) {
    for (const { name, record } of inspections) {
      results.push(
        checkInspection(name, record, todayIso, { ruleSet, tables, liftDateIso: options.liftDateIso ?? null }),
      );
    }
  }
  return results;
}
