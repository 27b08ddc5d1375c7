// Sling checks: each leg against its WLL x hitch factor, the whole sling by the multi-leg rules,
// and every leg's angle against the rule set's limits (with the hook height or leg lengths that fix it).
import type { BridleSolution } from "./bridle";
import type { Check, Fix, SlingSpec } from "./check-types";
import { failCheck, markedWll, ratioCheck, statedWllKg, type CheckBase } from "./checks-common";
import {
  DEFAULT_RULE_SET,
  findChainGrade8,
  findHitchFactor,
  findModeFactor,
  findTextileColour,
  findWireRope,
  publishedMultiLegT,
  TABLE_ANGLE_TOL_DEG,
  type Hitch,
  type ReferenceTables,
  type RuleSetId,
} from "./reference";

/** Leg angle from vertical up to which a leg counts as vertical, deg (when no rule set is given). */
export const VERTICAL_LEG_DEG = 5;
/** Leg angle from vertical above which a check warns, deg (when no rule set is given). */
export const WARN_LEG_DEG = 45;
/** Leg angle from vertical above which a check fails, deg (when no rule set is given). */
export const MAX_LEG_DEG = 60;

export type AngleLimits = { verticalDeg: number; warnDeg: number; maxDeg: number };
const DEFAULT_LIMITS: AngleLimits = { verticalDeg: VERTICAL_LEG_DEG, warnDeg: WARN_LEG_DEG, maxDeg: MAX_LEG_DEG };

/** Single-leg straight-lift WLL of a sling in kg, stated or looked up (chain by diameter, wire by diameter, textile by colour). */
export function resolveSlingWll(
  spec: SlingSpec,
  tables: ReferenceTables,
): { wllKg: number; source: string; from: "marked" | "table" | "assembly" } | null {
  const stated = statedWllKg(spec);
  if (stated !== null) {
    return spec.assemblyWll
      ? { wllKg: stated, source: "marked WLL of the sling assembly over its mode factor", from: "assembly" }
      : { wllKg: stated, source: "marked WLL of the sling", from: "marked" };
  }
  if (spec.kind === "chain" && spec.diameterMm !== undefined) {
    const row = findChainGrade8(tables.chainGrade8, spec.diameterMm);
    if (row) return { wllKg: row.singleLegT * 1000, source: row.source, from: "table" };
  }
  if (spec.kind === "wire" && spec.diameterMm !== undefined) {
    const row = findWireRope(tables.wireRope, spec.diameterMm);
    if (row) return { wllKg: row.singleLegT * 1000, source: row.source, from: "table" };
  }
  if ((spec.kind === "web" || spec.kind === "round") && spec.colour !== undefined) {
    const row = findTextileColour(tables.textileColours, spec.colour);
    if (row && !row.andAbove) return { wllKg: row.wllT * 1000, source: row.source, from: "table" };
  }
  return null;
}

/** Plain name of a sling by its marked size, e.g. "chain 8 mm, choke hitch". */
export function describeSling(spec: SlingSpec): string {
  const size = spec.diameterMm !== undefined ? ` ${spec.diameterMm} mm` : spec.colour ? ` ${spec.colour}` : "";
  const kind =
    spec.kind === "web"
      ? "webbing"
      : spec.kind === "round"
        ? "roundsling"
        : spec.kind === "wire"
          ? "wire rope"
          : "chain";
  const hitch = spec.hitch === "straight" ? "" : `, ${spec.hitch} hitch`;
  return `${kind}${size}${hitch}`;
}

export interface SlingLegOptions {
  ruleSet?: RuleSetId;
  /** The hitches this leg can make (default: any). */
  allowedHitches?: Hitch[];
}

/** Sling leg: design leg load (kg, >= 0) against single-leg WLL x the rule set's hitch factor. */
export function checkSlingLeg(
  legId: string,
  designLoadKg: number,
  spec: SlingSpec,
  tables: ReferenceTables,
  options: SlingLegOptions = {},
): Check {
  const ruleSet = options.ruleSet ?? DEFAULT_RULE_SET;
  const allowed = options.allowedHitches ?? (["straight", "choke", "basket"] as Hitch[]);
  const wll = resolveSlingWll(spec, tables);
  const hitch = findHitchFactor(tables.hitchFactors, spec.hitch, ruleSet);
  const base: CheckBase = {
    id: `sling-leg-${legId}`,
    kind: "sling-leg",
    item: `Sling leg ${legId} (${describeSling(spec)})`,
    itemCode: spec.itemCode ?? null,
    position: { legs: [legId] },
    rule: "Leg load against the single-leg WLL x hitch factor",
    ruleSet,
    source: hitch?.source ?? "hitch factor table",
    inputs: {
      hitch: spec.hitch,
      allowedHitches: allowed,
      ...markedWll(spec.assemblyWll ? { wll: spec.assemblyWll } : spec),
      ...(wll ? { wllKg: wll.wllKg, wllFrom: wll.from } : {}),
      ...(hitch ? { hitchFactor: hitch.factor } : {}),
    },
  };
  if (!allowed.includes(spec.hitch)) {
    // No credit for a hitch that cannot be made: show the straight figures beside the refusal.
    const capacity = wll ? wll.wllKg : null;
    return failCheck(
      { ...base, rule: "The hitch must be one the sling and its attachment can make" },
      "hitch-impossible",
      { kind: "hitch", allowed },
      designLoadKg,
      capacity,
    );
  }
  if (wll === null || hitch === null) return failCheck(base, "no-wll", { kind: "state-wll" }, designLoadKg, null);
  return ratioCheck({ ...base, source: `${wll.source}; ${hitch.source}` }, designLoadKg, wll.wllKg * hitch.factor, {
    kind: "larger-item",
    minWllKg: designLoadKg / hitch.factor,
  });
}

export interface AssemblyOptions {
  ruleSet?: RuleSetId;
  /** What fixes a sling whose legs lie beyond the rule set's largest angle. */
  angleFix?: Fix | null;
}

/**
 * Whole sling by the rule set's multi-leg rule: load (kg) against the lowest leg WLL x hitch x mode
 * factor for the effective legs and largest angle from vertical; under UK/EU rules also capped by the
 * published EN 818-4 / EN 13414-1 table for slings given by size.
 */
export function checkSlingAssembly(
  loadKg: number,
  specs: readonly SlingSpec[],
  effectiveLegs: 1 | 2 | 3,
  maxAngleFromVerticalDeg: number,
  ratingRule: string,
  tables: ReferenceTables,
  options: AssemblyOptions = {},
): Check {
  const ruleSet = options.ruleSet ?? DEFAULT_RULE_SET;
  const base: CheckBase = {
    id: "sling-assembly",
    kind: "sling-assembly",
    item: `${specs.length}-leg sling`,
    itemCode: null,
    position: { legs: [] },
    rule: "Load against the sling's rating: lowest leg WLL x hitch factor x mode factor",
    ruleSet,
    source: "mode factor table",
    inputs: { effectiveLegs, angleFromVerticalDeg: maxAngleFromVerticalDeg, ratingRule },
  };
  let legCapacity = Infinity;
  let sources = "";
  for (const s of specs) {
    const wll = resolveSlingWll(s, tables);
    const hitch = findHitchFactor(tables.hitchFactors, s.hitch, ruleSet);
    if (wll === null || hitch === null) return failCheck(base, "no-wll", { kind: "state-wll" }, loadKg, null);
    legCapacity = Math.min(legCapacity, wll.wllKg * hitch.factor);
    sources = wll.source;
  }
  const mode = findModeFactor(tables.modeFactors, effectiveLegs, maxAngleFromVerticalDeg, ruleSet);
  if (mode === null) {
    const ratedUpToDeg = Math.max(
      0,
      ...tables.modeFactors
        .filter((r) => r.ruleSet === ruleSet && r.effectiveLegs === effectiveLegs)
        .map((r) => r.upToAngleDeg),
    );
    return failCheck(
      { ...base, inputs: { ...base.inputs, wllKg: legCapacity, modeUpToDeg: ratedUpToDeg } },
      "no-mode-factor",
      options.angleFix ?? null,
      loadKg,
      0,
    );
  }
  let capacityKg = legCapacity * mode.factor;
  let source = `${mode.source}; ${sources}`;
  let publishedCapT: number | undefined;
  const first = specs[0];
  const sameSize =
    first !== undefined &&
    first.diameterMm !== undefined &&
    specs.every(
      (s) =>
        s.kind === first.kind &&
        s.diameterMm === first.diameterMm &&
        statedWllKg(s) === null &&
        s.hitch === first.hitch,
    );
  // Published EN tables round some multi-leg values below factor x single leg: never exceed them.
  if (ruleSet === "uk-eu" && sameSize && (first.kind === "chain" || first.kind === "wire")) {
    const row =
      first.kind === "chain"
        ? findChainGrade8(tables.chainGrade8, first.diameterMm!)
        : findWireRope(tables.wireRope, first.diameterMm!);
    const hitch = findHitchFactor(tables.hitchFactors, first.hitch, ruleSet);
    const publishedT = row ? publishedMultiLegT(row, effectiveLegs, maxAngleFromVerticalDeg) : null;
    if (row && hitch && publishedT !== null && publishedT * 1000 * hitch.factor < capacityKg) {
      capacityKg = publishedT * 1000 * hitch.factor;
      publishedCapT = publishedT;
      source = `${row.source}; ${source}`;
    }
  }
  return ratioCheck(
    {
      ...base,
      rule: `${base.rule} for ${effectiveLegs} leg${effectiveLegs > 1 ? "s" : ""} carrying, up to ${mode.upToAngleDeg} deg`,
      source,
      inputs: {
        ...base.inputs,
        wllKg: legCapacity,
        modeFactor: mode.factor,
        modeUpToDeg: mode.upToAngleDeg,
        ...(publishedCapT !== undefined ? { publishedCapT } : {}),
      },
    },
    loadKg,
    capacityKg,
    { kind: "larger-item", minWllKg: (loadKg / capacityKg) * legCapacity },
  );
}

export interface LegAngleOptions {
  ruleSet?: RuleSetId;
  limits?: AngleLimits;
  source?: string;
  /** What brings the leg back within the limit it breaks (warn: the warning angle; fail: the largest). */
  fix?: { warn: Fix | null; fail: Fix | null };
  mode?: "level" | "lengths";
}

const ANGLE_SOURCE =
  "29 CFR 1910.184(b) (within 5 deg counts vertical); OSHA Guidance on Safe Sling Use; EN 818-6 practice (beta never above 60 deg)";

/** Leg angle from vertical against the rule set's limits: vertical, up to the warning angle, warns, fails past the largest. */
export function checkLegAngle(legId: string, angleFromVerticalDeg: number, options: LegAngleOptions = {}): Check {
  const limits = options.limits ?? DEFAULT_LIMITS;
  const beta = angleFromVerticalDeg;
  const base = {
    id: `angle-${legId}`,
    kind: "leg-angle" as const,
    item: `Sling leg ${legId}`,
    itemCode: null,
    position: { legs: [legId] },
    ruleSet: options.ruleSet ?? DEFAULT_RULE_SET,
    source: options.source ?? ANGLE_SOURCE,
    inputs: { angleFromVerticalDeg: beta, limits, ...(options.mode ? { mode: options.mode } : {}) },
    loadKg: null,
    capacityKg: null,
    utilisation: null,
  };
  if (beta <= limits.verticalDeg + TABLE_ANGLE_TOL_DEG) {
    return {
      ...base,
      verdict: "pass",
      finding: "vertical",
      rule: `Within ${limits.verticalDeg} deg of vertical counts as vertical`,
      fix: null,
    };
  }
  if (beta <= limits.warnDeg + TABLE_ANGLE_TOL_DEG) {
    return {
      ...base,
      verdict: "pass",
      finding: "angle-ok",
      rule: `Leg angle up to ${limits.warnDeg} deg from vertical`,
      fix: null,
    };
  }
  if (beta <= limits.maxDeg + TABLE_ANGLE_TOL_DEG) {
    return {
      ...base,
      verdict: "warn",
      finding: "angle-warn",
      rule: `Leg angle ${limits.warnDeg}-${limits.maxDeg} deg from vertical: reduced rating`,
      fix: options.fix?.warn ?? null,
    };
  }
  return {
    ...base,
    verdict: "fail",
    finding: "angle-fail",
    rule: `Leg angle over ${limits.maxDeg} deg from vertical (under ${90 - limits.maxDeg} deg from horizontal)`,
    fix: options.fix?.fail ?? null,
  };
}

/**
 * What brings every taut leg within limitDeg from vertical: in a level lift, the lowest hook height
 * that does (component frame, m); with given lengths, how long each leg too steep must be (the hook
 * taken to rise plumb, so roughly: the load re-settles).
 */
export function angleFix(solution: BridleSolution, limitDeg: number): Fix | null {
  const tanLimit = Math.tan((limitDeg * Math.PI) / 180);
  const sinLimit = Math.sin((limitDeg * Math.PI) / 180);
  const taut = solution.legs.filter((l) => !l.slack);
  if (taut.length === 0 || !(tanLimit > 0)) return null;
  if (solution.mode === "level") {
    let minHookZM = -Infinity;
    for (const leg of taut) {
      const d = leg.direction;
      const reachM = leg.lengthM * Math.hypot(d.x, d.y);
      const pointZM = solution.hook.z - leg.lengthM * d.z;
      minHookZM = Math.max(minHookZM, pointZM + reachM / tanLimit);
    }
    return Number.isFinite(minHookZM) ? { kind: "raise-hook", minHookZM } : null;
  }
  const legs = taut
    .filter((l) => l.angleFromVerticalDeg > limitDeg + TABLE_ANGLE_TOL_DEG)
    .map((l) => ({
      legId: l.liftPointId,
      minLengthM: (l.lengthM * Math.sin((l.angleFromVerticalDeg * Math.PI) / 180)) / sinLimit,
    }));
  return legs.length ? { kind: "longer-legs", legs } : null;
}
