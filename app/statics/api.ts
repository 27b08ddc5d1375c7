// The /api/solve contract: body schema, and a handler that never throws for any input.
import { z } from "zod";
import { isIsoDate } from "~/utils/dates";
import { solveArrangement, type ArrangementInput } from "./arrangement";
import type { LiftPoint } from "./bridle";
import type { RiggingDescription } from "./check-types";
import { DEFAULT_RULE_SET, RULE_SET_IDS, type ReferenceTables, type RuleSetId } from "./reference";
import type { ArrangementOutcome } from "./response";

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
const isoDate = z.string().refine(isIsoDate, "Use a real calendar date, YYYY-MM-DD.");
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

export type SolveResponse = ArrangementOutcome | { status: 400; body: { error: string; issues: unknown[] } };

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

/** The core's input for a parsed body: the rule set from the body, else the organisation's, else the default. */
export function toArrangementInput(body: SolveBody, context: SolveContext = {}): ArrangementInput {
  const liftPoints = toLiftPoints(body).map((p, i) => {
    const thread = body.liftPoints[i]!.thread;
    return thread !== undefined ? { ...p, thread } : p;
  });
  const lengths = body.legLengths ?? {};
  return {
    load: { massKg: body.load.massKg, cog: body.load.cog },
    liftPoints,
    hanging:
      body.hook !== undefined
        ? { kind: "level", hookZM: body.hook.z }
        : {
            kind: "lengths",
            legLengthsM: liftPoints.map((p) => (Object.hasOwn(lengths, p.id) ? (lengths[p.id] ?? 0) : 0)),
          },
    ...(body.rigging !== undefined ? { rigging: body.rigging as RiggingDescription } : {}),
    ruleSet: body.ruleSet ?? context.defaultRuleSet ?? DEFAULT_RULE_SET,
    ...(context.todayIso !== undefined ? { todayIso: context.todayIso } : {}),
    liftDateIso: body.liftDate ?? null,
    ...(body.fit !== undefined ? { fit: body.fit } : {}),
  };
}

/** The /api/solve body for a bridle's input (the inverse of toArrangementInput); null for a beam, which the API does not take. */
export function toSolveBody(input: ArrangementInput): SolveBody | null {
  const { hanging } = input;
  if (hanging.kind === "beam") return null;
  return {
    load: { massKg: input.load.massKg, cog: input.load.cog },
    liftPoints: input.liftPoints.map((p) => ({
      id: p.id,
      ...p.position,
      axis: p.axis,
      ...(p.thread !== undefined ? { thread: p.thread } : {}),
    })),
    ...(hanging.kind === "level"
      ? { hook: { z: hanging.hookZM } }
      : { legLengths: Object.fromEntries(input.liftPoints.map((p, i) => [p.id, hanging.legLengthsM[i] ?? 0])) }),
    ...(input.rigging !== undefined ? { rigging: input.rigging as SolveBody["rigging"] } : {}),
    ruleSet: input.ruleSet,
    ...(input.liftDateIso ? { liftDate: input.liftDateIso } : {}),
    ...(input.fit !== undefined ? { fit: input.fit } : {}),
  };
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
    return solveArrangement(toArrangementInput(parsed.data, context), tables);
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
