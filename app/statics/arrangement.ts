// The one way into the statics core for a whole arrangement: a bridle (level or given lengths) or a
// lifting beam, solved and checked under a rule set. Pure: the callers parse their own input (JSON at
// /api/solve, a plan's document and register items on the server) into these types.
import { checkSentence } from "~/plans/check-text";
import { solveBeamArrangement, type BeamSpec } from "./beam-arrangement";
import { solveGivenLengths, solveLevel, type LiftPoint } from "./bridle";
import type { Check, RiggingDescription } from "./check-types";
import { angleChecks, checkLegItem, checkRigging } from "./checks";
import { lowestPassingHookZ } from "./raise-hook";
import type { ReferenceTables, RuleSetId } from "./reference";
import { toCheckResult, toResponseBody, uniqueById, type ArrangementOutcome } from "./response";
import { checkFitTilt, levellingLengths, type FitTolerance } from "./tilt";
import type { Vec3 } from "./vector";

/** A lift point with its axis as a unit vector, and the thread tapped there when known. */
export type ArrangementLiftPoint = LiftPoint & { thread?: string };

export type BeamHanging = { kind: "beam"; hookZM: number; beam: BeamSpec };

/** How the load hangs: legs to a hook at a height, legs of given lengths (m, in lift point order), or a beam. */
export type Hanging = { kind: "level"; hookZM: number } | { kind: "lengths"; legLengthsM: number[] } | BeamHanging;

export type { BeamSpec };

export type Note = { code: string; message: string };

export interface ArrangementInput {
  /** The load's mass (kg) and centre of gravity (component frame, m). */
  load: { massKg: number; cog: Vec3 };
  liftPoints: ArrangementLiftPoint[];
  hanging: Hanging;
  /** The gear on each leg and at the hook; without it a bridle gets its leg-angle checks only. */
  rigging?: RiggingDescription;
  ruleSet: RuleSetId;
  /** Today's date YYYY-MM-DD for the inspection checks. */
  todayIso?: string;
  /** The planned lift date YYYY-MM-DD: inspections are judged against it as well as today. */
  liftDateIso?: string | null;
  /** The component's fit tolerance: asks for the check of the load's tilt against it (bridles). */
  fit?: FitTolerance;
  /**
   * What the caller found about the gear before the solve (items never examined, a multi-leg sling's
   * per-leg WLL): added to the checks and warnings, and then each check is listed once by id.
   */
  extra?: { checks: Check[]; notes: Note[] };
}

/** Warnings for legs past the rule set's angles, so a bare solve says so too. */
function angleWarnings(checks: readonly Check[]): Note[] {
  return checks
    .filter((c) => c.kind === "leg-angle" && c.verdict !== "pass")
    .map((c) => ({
      code: c.verdict === "fail" ? "LEG_ANGLE_OVER_MAX" : "LEG_ANGLE_OVER_WARN",
      message: checkSentence(c, "metric"),
    }));
}

function solveBridle(input: ArrangementInput, hanging: Exclude<Hanging, BeamHanging>, tables: ReferenceTables) {
  const { load, liftPoints, ruleSet } = input;
  const outcome =
    hanging.kind === "level"
      ? solveLevel(load, liftPoints, hanging.hookZM)
      : solveGivenLengths(load, liftPoints, hanging.legLengthsM);
  if (!outcome.ok) return { status: 422 as const, body: { error: outcome.message, code: outcome.code } };
  const body = toResponseBody(outcome.solution, ruleSet);
  const levelling = hanging.kind === "lengths" ? levellingLengths(load, liftPoints, hanging.legLengthsM) : null;
  if (levelling) body.levelling = levelling.ok ? { hookZM: levelling.hookZM, legs: levelling.legs } : null;
  const lifted = liftPoints.map((p) => ({ id: p.id, thread: p.thread, axis: p.axis }));
  const checkAt = (solution: typeof outcome.solution) =>
    input.rigging !== undefined
      ? checkRigging(solution, load.massKg, load.cog, lifted, input.rigging, tables, input.todayIso, {
          ruleSet,
          liftDateIso: input.liftDateIso ?? null,
        })
      : angleChecks(solution, tables, ruleSet);
  const checks = checkAt(outcome.solution);
  if (input.fit !== undefined) checks.push(checkFitTilt(outcome.solution, input.fit, levelling, ruleSet));
  const { rigging } = input;
  if (hanging.kind === "level" && rigging !== undefined) {
    // A leg item over its rating in a level lift: the hook height at which the same item would pass.
    const reach = Math.max(
      0.1,
      ...liftPoints.map((p) => Math.hypot(p.position.x - load.cog.x, p.position.y - load.cog.y)),
    );
    const top = Math.max(hanging.hookZM, ...liftPoints.map((p) => p.position.z)) + 5 * reach;
    for (const c of checks) {
      if (c.verdict !== "fail" || (c.fix?.kind !== "larger-item" && c.fix?.kind !== "tapped-size-limit")) continue;
      if (c.kind !== "sling-leg" && c.kind !== "eyebolt" && c.kind !== "shackle") continue;
      const z = lowestPassingHookZ(
        (hookZM) => {
          const level = solveLevel(load, liftPoints, hookZM);
          // The item's own check only: the same verdict checkAt gives it, without every other check each step.
          return level.ok && checkLegItem(level.solution, lifted, rigging, tables, c.id, ruleSet)?.verdict === "pass";
        },
        hanging.hookZM,
        top,
      );
      if (z !== null) c.fix = { ...c.fix, orRaiseHookToZM: z };
    }
  }
  body.checks = checks.map(toCheckResult);
  body.warnings.push(...angleWarnings(checks));
  if (input.extra) {
    body.warnings.push(...input.extra.notes);
    body.checks = uniqueById([...body.checks, ...input.extra.checks.map(toCheckResult)]);
  }
  return { status: 200 as const, body };
}

/** Solves an arrangement and checks its rigging: 200 with the legs, hook and checks, or 422 when it cannot hang. */
export function solveArrangement(input: ArrangementInput, tables: ReferenceTables): ArrangementOutcome {
  const { hanging } = input;
  if (hanging.kind === "beam") return solveBeamArrangement({ ...input, hanging }, tables);
  return solveBridle(input, hanging, tables);
}
