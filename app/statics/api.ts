// The /api/solve contract: body schema, and a handler that never throws for any input.
import { z } from "zod";
import { checkSentence } from "~/plans/check-text";
import { solveGivenLengths, solveLevel, type BridleSolution, type LiftPoint } from "./bridle";
import type { Check, CheckResult, RiggingDescription } from "./check-types";
import { angleChecks, checkRigging } from "./checks";
import { DEFAULT_RULE_SET, RULE_SET_IDS, type ReferenceTables, type RuleSetId } from "./reference";
import { lowestPassingHookZ } from "./raise-hook";
import { checkFitTilt, levellingLengths, planeTilts, type LegLevelling, type PlaneTilts } from "./tilt";

/** Largest load mass accepted, kg (100,000 t: beyond any crane lift). */
export const MAX_MASS_KG = 1e8;
/** Largest coordinate magnitude accepted, m. */
export const MAX_COORD_M = 1000;
/** Longest leg accepted, m. */
export const MAX_LEG_LENGTH_M = 2000;

const coord = z.number().min(-MAX_COORD_M).max(MAX_COORD_M);
const point = z.object({ x: coord, y: coord, z: coord });
const axis = z
  .object({
    x: z.number().min(-1000).max(1000),
    y: z.number().min(-1000).max(1000),
    z: z.number().min(-1000).max(1000),
  })
  .refine((a) => Math.hypot(a.x, a.y, a.z) > 1e-9, { message: "The axis must not be a zero vector." });
const positiveMass = z.number().gt(0).max(MAX_MASS_KG);
const id = z.string().min(1).max(64);

const wll = z.object({ value: positiveMass, unit: z.enum(["kg", "t", "lb", "shortTon"]) });
const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "Use a YYYY-MM-DD date.");
/** An item's identity in the register and its own mass (kg), added to the hook and crane loads. */
const identity = { itemCode: id.optional(), massKg: z.number().min(0).max(1e6).optional() };
const inspection = z.object({
  itemId: id,
  status: z.enum(["in_service", "quarantined", "withdrawn"]),
  examinationDue: isoDate,
});
const oneWll = (v: { wllKg?: number | undefined; wll?: unknown }): boolean =>
  !(v.wllKg !== undefined && v.wll !== undefined);
const oneWllMessage = { message: "Give either wllKg or wll, not both." };

const slingSpec = z
  .object({
    kind: z.enum(["chain", "wire", "web", "round"]),
    wllKg: positiveMass.optional(),
    wll: wll.optional(),
    hitch: z.enum(["straight", "choke", "basket"]).default("straight"),
    grade: z.string().max(16).optional(),
    diameterMm: z.number().gt(0).max(500).optional(),
    colour: z.string().max(16).optional(),
    assemblyLegs: z.number().int().min(1).max(4).optional(),
    assemblyWll: wll.optional(),
    inspection: inspection.optional(),
    ...identity,
  })
  .refine(oneWll, oneWllMessage);
const shackleSpec = z
  .object({
    wllKg: positiveMass.optional(),
    wll: wll.optional(),
    type: z.enum(["bow", "dee"]),
    pin: z.enum(["screw", "bolt"]).optional(),
    sideLoadAngleDeg: z.number().min(0).max(180).optional(),
    inspection: inspection.optional(),
    ...identity,
  })
  .refine(oneWll, oneWllMessage);
const eyeboltSpec = z
  .object({
    family: z.enum(["collar", "shoulder", "plain"]),
    thread: z.string().min(1).max(16),
    wllKg: positiveMass.optional(),
    wll: wll.optional(),
    eyeAlignedWithPull: z.boolean().optional(),
    inspection: inspection.optional(),
    ...identity,
  })
  .refine(oneWll, oneWllMessage);

export const riggingSchema = z.object({
  legs: z
    .record(
      id,
      z.object({
        sling: slingSpec.optional(),
        shackle: shackleSpec.optional(),
        eyebolt: eyeboltSpec.optional(),
        eyePlane: z.enum(["pull", "x", "y"]).optional(),
      }),
    )
    .optional(),
  sharedShackles: z
    .array(
      z
        .object({
          legIds: z.tuple([id, id]),
          wllKg: positiveMass.optional(),
          wll: wll.optional(),
          inspection: inspection.optional(),
          ...identity,
        })
        .refine(oneWll, oneWllMessage)
        .refine((s) => s.legIds[0] !== s.legIds[1], { message: "A shared shackle joins two different legs." }),
    )
    .max(4)
    .optional(),
  masterLink: z
    .object({ wllKg: positiveMass.optional(), wll: wll.optional(), inspection: inspection.optional(), ...identity })
    .refine(oneWll, oneWllMessage)
    .optional(),
  crane: z
    .object({
      swlKg: positiveMass,
      swl: wll.optional(),
      maxHookHeightM: z.number().gt(0).max(MAX_COORD_M).optional(),
      itemCode: id.optional(),
      inspection: inspection.optional(),
    })
    .optional(),
  headroom: z
    .object({ clearanceAboveFloorM: z.number().min(0).max(MAX_COORD_M), loadUndersideZM: coord.optional() })
    .optional(),
  contingencyPct: z.number().min(0).max(100).optional(),
  riggingMassKg: z.number().min(0).max(MAX_MASS_KG).optional(),
});

export const solveBodySchema = z
  .object({
    load: z.object({ massKg: positiveMass, cog: point }),
    liftPoints: z
      .array(
        z.object({
          id,
          x: coord,
          y: coord,
          z: coord,
          axis: axis.optional(),
          thread: z.string().min(1).max(16).optional(),
        }),
      )
      .min(1)
      .max(4),
    hook: z.object({ z: coord }).optional(),
    legLengths: z.record(z.string(), z.number().min(0).max(MAX_LEG_LENGTH_M)).optional(),
    rigging: riggingSchema.optional(),
    ruleSet: z.enum(RULE_SET_IDS).optional(),
    /** The planned lift date: inspections are judged against it as well as today. */
    liftDate: isoDate.optional(),
    /** The component's fit tolerance (deg; null: none recorded, common practice applies): asks for the tilt check. */
    fit: z
      .object({ toleranceDeg: z.number().gt(0).max(45).nullable(), source: z.string().max(500).optional() })
      .optional(),
  })
  .superRefine((body, ctx) => {
    const ids = body.liftPoints.map((p) => p.id);
    const seen = new Set<string>();
    ids.forEach((pid, i) => {
      if (seen.has(pid))
        ctx.addIssue({
          code: "custom",
          path: ["liftPoints", i, "id"],
          message: `Lift point id "${pid}" is used twice; ids must be unique.`,
        });
      seen.add(pid);
    });
    if ((body.hook === undefined) === (body.legLengths === undefined)) {
      ctx.addIssue({
        code: "custom",
        path: [],
        message: 'Give exactly one of "hook" (level lift) and "legLengths" (given slings).',
      });
    }
    if (body.legLengths !== undefined) {
      const keys = Object.keys(body.legLengths);
      for (const k of keys) {
        if (!seen.has(k))
          ctx.addIssue({ code: "custom", path: ["legLengths", k], message: `Leg length "${k}" names no lift point.` });
      }
      for (const pid of seen) {
        if (!Object.hasOwn(body.legLengths, pid))
          ctx.addIssue({ code: "custom", path: ["legLengths"], message: `Give a leg length for lift point "${pid}".` });
      }
    }
    for (const k of Object.keys(body.rigging?.legs ?? {})) {
      if (!seen.has(k))
        ctx.addIssue({
          code: "custom",
          path: ["rigging", "legs", k],
          message: `Rigging for "${k}" names no lift point.`,
        });
    }
    (body.rigging?.sharedShackles ?? []).forEach((s, i) => {
      for (const lid of s.legIds) {
        if (!seen.has(lid))
          ctx.addIssue({
            code: "custom",
            path: ["rigging", "sharedShackles", i, "legIds"],
            message: `Shared shackle names leg "${lid}", which is no lift point.`,
          });
      }
    });
  });

export type SolveBody = z.infer<typeof solveBodySchema>;

export interface SolveLegBody {
  liftPointId: string;
  lengthM: number;
  tensionKn: number;
  tensionKg: number;
  angleFromVerticalDeg: number;
  axisAngleDeg: number;
  verticalShare: number;
  slack: boolean;
}

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

export type SolveResponse =
  | { status: 200; body: SolveResponseBody }
  | { status: 400; body: { error: string; issues: unknown[] } }
  | { status: 422; body: { error: string; code: string } };

export interface SolveContext {
  /** Today's date YYYY-MM-DD for inspection checks (server clock; never taken from the body). */
  todayIso?: string;
  /** The rule set when the body names none (the organisation's); default UK / EU. */
  defaultRuleSet?: RuleSetId;
}

function describeIssue(issue: z.core.$ZodIssue): string {
  const path = issue.path.map((p) => String(p)).join(".");
  return path ? `${path}: ${issue.message}` : issue.message;
}

/** Parses a solve body into the core's lift points (axis normalised, default +z). */
export function toLiftPoints(body: SolveBody): LiftPoint[] {
  return body.liftPoints.map((p) => {
    const a = p.axis ?? { x: 0, y: 0, z: 1 };
    const n = Math.hypot(a.x, a.y, a.z);
    return { id: p.id, position: { x: p.x, y: p.y, z: p.z }, axis: { x: a.x / n, y: a.y / n, z: a.z / n } };
  });
}

/** A structured check as the API answers it: with the older `status` and a metric `message`, so existing clients keep working. */
export function toCheckResult(check: Check): CheckResult {
  return { ...check, status: check.verdict, message: checkSentence(check, "metric", { withUtilisation: true }) };
}

/** Warnings for legs past the rule set's angles, so a bare solve says so too. */
function angleWarnings(checks: readonly Check[]): Array<{ code: string; message: string }> {
  return checks
    .filter((c) => c.kind === "leg-angle" && c.verdict !== "pass")
    .map((c) => ({
      code: c.verdict === "fail" ? "LEG_ANGLE_OVER_MAX" : "LEG_ANGLE_OVER_WARN",
      message: checkSentence(c, "metric"),
    }));
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
    legs: solution.legs.map((l) => ({
      liftPointId: l.liftPointId,
      lengthM: l.lengthM,
      tensionKn: l.tensionKn,
      tensionKg: l.tensionKg,
      angleFromVerticalDeg: l.angleFromVerticalDeg,
      axisAngleDeg: l.axisAngleDeg,
      verticalShare: l.verticalShare,
      slack: l.slack,
    })),
    warnings: solution.warnings.map((w) => ({ code: w.code, message: w.message })),
    rating: solution.rating,
    ruleSet,
    checks: [],
  };
}

function solveParsed(body: SolveBody, tables: ReferenceTables, context: SolveContext): SolveResponse {
  const points = toLiftPoints(body);
  const load = { massKg: body.load.massKg, cog: body.load.cog };
  let outcome;
  let levelling = null;
  if (body.hook !== undefined) {
    outcome = solveLevel(load, points, body.hook.z);
  } else {
    const lengths = body.legLengths ?? {};
    const given = points.map((p) => (Object.hasOwn(lengths, p.id) ? (lengths[p.id] ?? 0) : 0));
    outcome = solveGivenLengths(load, points, given);
    if (outcome.ok) levelling = levellingLengths(load, points, given);
  }
  if (!outcome.ok) return { status: 422, body: { error: outcome.message, code: outcome.code } };
  const ruleSet = body.ruleSet ?? context.defaultRuleSet ?? DEFAULT_RULE_SET;
  const responseBody = toResponseBody(outcome.solution, ruleSet);
  const lifted = points.map((p, i) => ({ id: p.id, thread: body.liftPoints[i]!.thread, axis: p.axis }));
  if (levelling) responseBody.levelling = levelling.ok ? { hookZM: levelling.hookZM, legs: levelling.legs } : null;
  const checks =
    body.rigging !== undefined
      ? checkRigging(
          outcome.solution,
          body.load.massKg,
          body.load.cog,
          lifted,
          body.rigging as RiggingDescription,
          tables,
          context.todayIso,
          { ruleSet, liftDateIso: body.liftDate ?? null },
        )
      : angleChecks(outcome.solution, tables, ruleSet);
  if (body.fit !== undefined) checks.push(checkFitTilt(outcome.solution, body.fit, levelling, ruleSet));
  if (body.hook !== undefined && body.rigging !== undefined) {
    // A leg item over its rating in a level lift: the hook height at which the same item would pass.
    const reach = Math.max(0.1, ...points.map((p) => Math.hypot(p.position.x - load.cog.x, p.position.y - load.cog.y)));
    const top = Math.max(body.hook.z, ...points.map((p) => p.position.z)) + 5 * reach;
    for (const c of checks) {
      if (c.verdict !== "fail" || (c.fix?.kind !== "larger-item" && c.fix?.kind !== "tapped-size-limit")) continue;
      if (c.kind !== "sling-leg" && c.kind !== "eyebolt" && c.kind !== "shackle") continue;
      const z = lowestPassingHookZ(
        (hookZM) => {
          const level = solveLevel(load, points, hookZM);
          if (!level.ok) return false;
          const again = checkRigging(
            level.solution,
            load.massKg,
            load.cog,
            lifted,
            body.rigging as RiggingDescription,
            tables,
            context.todayIso,
            { ruleSet, liftDateIso: body.liftDate ?? null },
          );
          return again.find((x) => x.id === c.id)?.verdict === "pass";
        },
        body.hook.z,
        top,
      );
      if (z !== null) c.fix = { ...c.fix, orRaiseHookToZM: z };
    }
  }
  responseBody.checks = checks.map(toCheckResult);
  responseBody.warnings.push(...angleWarnings(checks));
  return { status: 200, body: responseBody };
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

/** Keys JSON can carry but object parsing drops ("__proto__"): refuse them rather than ignore them. */
function droppedKeyIssues(body: unknown): Array<{ code: "custom"; path: string[]; message: string }> {
  const issues: Array<{ code: "custom"; path: string[]; message: string }> = [];
  if (!isRecord(body)) return issues;
  const maps: Array<[string[], unknown]> = [
    [["legLengths"], body["legLengths"]],
    [["rigging", "legs"], isRecord(body["rigging"]) ? body["rigging"]["legs"] : undefined],
  ];
  for (const [path, map] of maps) {
    if (isRecord(map) && Object.hasOwn(map, "__proto__")) {
      issues.push({ code: "custom", path: [...path, "__proto__"], message: '"__proto__" names no lift point.' });
    }
  }
  return issues;
}

/** Handles a POST /api/solve body (any JSON value): 200 with the solution, 400 bad input, 422 cannot hang. Never throws. */
export function handleSolve(body: unknown, tables: ReferenceTables, context: SolveContext = {}): SolveResponse {
  try {
    const dropped = droppedKeyIssues(body);
    if (dropped.length > 0) {
      return {
        status: 400,
        body: {
          error: `The solve request is not valid: ${dropped[0]!.path.join(".")}: ${dropped[0]!.message}`,
          issues: dropped,
        },
      };
    }
    const parsed = solveBodySchema.safeParse(body);
    if (!parsed.success) {
      const first = parsed.error.issues[0];
      return {
        status: 400,
        body: {
          error: `The solve request is not valid${first ? `: ${describeIssue(first)}` : "."}`,
          issues: parsed.error.issues,
        },
      };
    }
    return solveParsed(parsed.data, tables, context);
  } catch {
    // Defence in depth: the contract is never a 500. The tests assert this path is not reached.
    return {
      status: 422,
      body: {
        error: "This arrangement could not be solved; check the lift points, hook and leg lengths.",
        code: "UNSOLVABLE",
      },
    };
  }
}
