// The shape of a solved arrangement as /api/solve answers it and plans store it.
import { checkSentence } from "~/plans/check-text";
import type { BeamPlacement } from "./beam-placement";
import type { BridleSolution, LegResult } from "./bridle";
import type { Check, CheckResult } from "./check-types";
import { DEFAULT_RULE_SET, type RuleSetId } from "./reference";
import { planeTilts, type LegLevelling, type PlaneTilts } from "./tilt";

export type SolveLegBody = Omit<LegResult, "direction">;

export interface SolveResponseBody {
  mode: "level" | "lengths";
  weightKn: number;
  method: "determinate" | "elastic";
  hook: { x: number; y: number; z: number };
  tiltDeg: number;
  /** The tilt in each of the component's own planes, deg (absent only in results stored before). */
  tiltPlanes?: PlaneTilts;
  /** Given lengths: the length each leg would need to hang the load level, and the change; null when no level hang exists. */
  levelling?: { hookZM: number; legs: LegLevelling[] } | null;
  legs: SolveLegBody[];
  warnings: Array<{ code: string; message: string }>;
  rating: BridleSolution["rating"];
  /** The rule set the checks applied (absent only in results stored before rule sets). */
  ruleSet?: RuleSetId;
  /** Every solve answers with the leg-angle checks; rigging adds a check per item (optional only for results stored before). */
  checks?: CheckResult[];
}

/** A solved arrangement: a bridle's body, and for a beam the beam and what it adds at the hook. */
export type ArrangementBody = SolveResponseBody & {
  beam?: {
    massKg: number;
    wllKg: number;
    hookMassKg: number;
    topLegs: SolveLegBody[];
    /** The register item the figures come from; absent on a plan whose beam was typed in (not from the register). */
    itemCode?: string;
    /** Where the beam hangs, component frame, m. */
    placement?: BeamPlacement;
  };
};

/** The arrangement hangs (200) or cannot hang as given (422, with the reason's code). */
export type ArrangementOutcome =
  { status: 200; body: ArrangementBody } | { status: 422; body: { error: string; code: string } };

/** A structured check as the API answers it: with the older `status` and a metric `message`, so existing clients keep working. */
export function toCheckResult(check: Check): CheckResult {
  return { ...check, status: check.verdict, message: checkSentence(check, "metric", { withUtilisation: true }) };
}

/** One check per id: a multi-leg sling on several legs is inspected once. */
export function uniqueById<T extends { id: string }>(items: T[]): T[] {
  const seen = new Set<string>();
  return items.filter((c) => (seen.has(c.id) ? false : (seen.add(c.id), true)));
}

/** A solved leg as the API answers it (without its direction). */
export function toLegBody(leg: LegResult): SolveLegBody {
  return {
    liftPointId: leg.liftPointId,
    lengthM: leg.lengthM,
    tensionKn: leg.tensionKn,
    tensionKg: leg.tensionKg,
    angleFromVerticalDeg: leg.angleFromVerticalDeg,
    axisAngleDeg: leg.axisAngleDeg,
    verticalShare: leg.verticalShare,
    slack: leg.slack,
  };
}

/** Maps a core solution to the 200 body of /api/solve (checks added by the caller). */
export function toResponseBody(solution: BridleSolution, ruleSet: RuleSetId = DEFAULT_RULE_SET): SolveResponseBody {
  return {
    mode: solution.mode,
    weightKn: solution.weightKn,
    method: solution.method,
    hook: { x: solution.hook.x, y: solution.hook.y, z: solution.hook.z },
    tiltDeg: solution.tiltDeg,
    tiltPlanes: planeTilts(solution.vertical),
    legs: solution.legs.map(toLegBody),
    warnings: solution.warnings.map((w) => ({ code: w.code, message: w.message })),
    rating: solution.rating,
    ruleSet,
    checks: [],
  };
}
