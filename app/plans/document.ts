// The editable lift plan document (arrangement, gear allocation, details) and its checks against
// the load snapshot. Pure and shared with the browser: no I/O, no server imports.
import { z } from "zod";
import type { ComponentDefinition } from "~/loads/component-definition";
import type { SolveResponseBody } from "~/statics/response";
import type { BeamPlacement } from "~/statics/beam-placement";
import { isIsoDate } from "~/utils/dates";
import { safeText } from "~/utils/forms";
import {
  effectiveOverride,
  loadOverrideSchema,
  overrideIssues,
  plannedLoad,
  type LoadOverride,
} from "~/plans/load-override";

export const PLAN_STATUSES = [
  "draft",
  "in_review",
  "returned",
  "approved",
  "superseded",
  "completed",
  "cancelled",
] as const;
export type PlanStatus = (typeof PLAN_STATUSES)[number];

export const PLAN_STATUS_LABELS: Record<PlanStatus, string> = {
  draft: "Draft",
  in_review: "In review",
  returned: "Returned with comments",
  approved: "Approved",
  superseded: "Superseded",
  completed: "Completed",
  cancelled: "Cancelled",
};

/** Shown wherever plan figures appear (results, print, approval). */
export const PLAN_CAUTION =
  "This plan supports, and does not replace, the judgement of the appointed person and local lifting regulations (LOLER / BS 7121, OSHA / ASME B30, or the local equivalent); work within the equipment's marked limits. Figures assume a rigid load, legs meeting at one point, the marked WLLs and the mass and CoG as entered.";

/** Longest plan title, characters. */
export const MAX_TITLE = 200;
/** Largest hook height or leg length accepted, m (matches the solve API's coordinate bound). */
export const MAX_PLAN_LENGTH_M = 1000;

const finite = (label: string) => z.number({ error: `Give the ${label} as a number.` }).finite();
const liftPointLabel = safeText()
  .min(1, "A lift point label cannot be empty.")
  .max(10, "A lift point label is at most 10 characters.");
const gearItemId = z
  .number({ error: "A gear item is given by its number." })
  .int("A gear item is given by its number.")
  .positive("A gear item is given by its number.");

// ----- arrangement -----

/**
 * The beam in a beam arrangement: the drops' length is the plan's; the beam itself is the register item
 * allocated as `rigging.beamItemId`. Mass, WLL and length typed on the plan are kept only for plans made
 * before beams were allocated from the register, and are used only when no beam is allocated.
 */
export const beamSchema = z.object({
  massKg: finite("beam's mass")
    .min(0, "The beam's mass cannot be negative.")
    .max(100_000, "The beam's mass is at most 100,000 kg.")
    .optional(),
  wllKg: finite("beam's WLL")
    .gt(0, "Give the beam's marked WLL.")
    .max(1e8, "The beam's WLL is at most 100,000 t.")
    .optional(),
  lengthM: finite("beam's length")
    .gt(0, "Give the beam's length.")
    .max(100, "The beam is at most 100 m long.")
    .optional(),
  dropLengthM: finite("drop length")
    .gt(0, "Give the length of the vertical drops.")
    .max(100, "A drop is at most 100 m long."),
});
export type BeamArrangement = z.infer<typeof beamSchema>;

export const arrangementSchema = z
  .object({
    kind: z.enum(["bridle", "beam"], {
      error: 'The arrangement is "bridle" (legs to one hook) or "beam" (vertical drops from a beam).',
    }),
    mode: z.enum(["level", "lengths"], {
      error: 'The mode is "level" (hook height given) or "lengths" (sling lengths given).',
    }),
    hookHeightM: finite("hook height")
      .min(-MAX_PLAN_LENGTH_M, "The hook height is out of range.")
      .max(MAX_PLAN_LENGTH_M, "The hook height is out of range."),
    legLengthsM: z
      .record(
        liftPointLabel,
        finite("leg length")
          .gt(0, "A leg must be longer than zero.")
          .max(MAX_PLAN_LENGTH_M, "A leg is at most 1,000 m long."),
      )
      .default({}),
    liftPointLabels: z
      .array(liftPointLabel)
      .min(1, "Use at least one lift point.")
      .max(4, "Use at most four lift points."),
    beam: beamSchema.optional(),
  })
  .superRefine((a, ctx) => {
    const seen = new Set<string>();
    a.liftPointLabels.forEach((label, i) => {
      if (seen.has(label))
        ctx.addIssue({ code: "custom", path: ["liftPointLabels", i], message: `Lift point ${label} is listed twice.` });
      seen.add(label);
    });
    if (a.kind === "beam") {
      if (!a.beam)
        ctx.addIssue({
          code: "custom",
          path: ["beam"],
          message: "A beam arrangement needs the length of its drops.",
        });
      if (a.mode !== "level")
        ctx.addIssue({
          code: "custom",
          path: ["mode"],
          message: "A beam hangs its drops vertically: use the level mode.",
        });
    }
    if (a.kind === "bridle" && a.mode === "lengths") {
      for (const label of a.liftPointLabels) {
        if (!Object.hasOwn(a.legLengthsM, label))
          ctx.addIssue({
            code: "custom",
            path: ["legLengthsM", label],
            message: `Give the length of the leg to lift point ${label}.`,
          });
      }
    }
    for (const key of Object.keys(a.legLengthsM)) {
      if (!seen.has(key))
        ctx.addIssue({
          code: "custom",
          path: ["legLengthsM", key],
          message: `Leg length ${key} names no lift point in use.`,
        });
    }
  });
export type Arrangement = z.infer<typeof arrangementSchema>;

// ----- gear allocation -----

export const HITCHES = ["straight", "choke", "basket"] as const;
export const HITCH_LABELS: Record<(typeof HITCHES)[number], string> = {
  straight: "Straight",
  choke: "Choke",
  basket: "Basket",
};

export const EYE_PLANES = ["pull", "x", "y"] as const;
export const EYE_PLANE_LABELS: Record<(typeof EYE_PLANES)[number], string> = {
  pull: "Faces the pull",
  x: "Along x",
  y: "Along y",
};

export const legRiggingSchema = z.object({
  eyeboltItemId: gearItemId.optional(),
  shackleItemId: gearItemId.optional(),
  slingItemId: gearItemId.optional(),
  hitch: z.enum(HITCHES, { error: 'The hitch is "straight", "choke" or "basket".' }).default("straight"),
  /** The plane of the eyebolt's eye or the lug: set to face the pull (default) or fixed along x or y. */
  eyePlane: z.enum(EYE_PLANES, { error: 'The eye plane is "pull", "x" or "y".' }).optional(),
});
export type LegRiggingAllocation = z.infer<typeof legRiggingSchema>;

export const riggingAllocationSchema = z.object({
  legs: z.record(liftPointLabel, legRiggingSchema).default({}),
  masterLinkItemId: gearItemId.optional(),
  /** No master link: the planner states the crane hook takes the legs (or the beam's top rigging) directly. */
  hookTakesLegs: z.boolean({ error: "Say whether the crane hook takes the legs directly (true or false)." }).optional(),
  craneItemId: gearItemId.optional(),
  /** The lifting beam or spreader from the register (beam arrangements). */
  beamItemId: gearItemId.optional(),
});
export type RiggingAllocation = z.infer<typeof riggingAllocationSchema>;

// ----- details: sequence, hazards, people -----

export const PERSON_ROLES = [
  "appointed_person",
  "lift_supervisor",
  "slinger_signaller",
  "crane_operator",
  "other",
] as const;
export type PersonRole = (typeof PERSON_ROLES)[number];
export const PERSON_ROLE_LABELS: Record<PersonRole, string> = {
  appointed_person: "Appointed person",
  lift_supervisor: "Lift supervisor",
  slinger_signaller: "Slinger/signaller",
  crane_operator: "Crane operator",
  other: "Other",
};

const text = (label: string, max: number, options: { multiline?: boolean } = {}) =>
  safeText({ ...options, error: `Give the ${label} as text.` })
    .trim()
    .max(max, `The ${label} can be at most ${max} characters.`);
const requiredText = (label: string, max: number) => text(label, max).min(1, `Enter the ${label}.`);

export const sequenceStepSchema = z.object({
  title: requiredText("step's title", 120),
  holdPoint: z.boolean({ error: "Say whether the step is a hold point (true or false)." }),
  notes: text("step's notes", 2000, { multiline: true }).default(""),
});
export type SequenceStep = z.infer<typeof sequenceStepSchema>;

export const MAX_STEPS = 40;
export const MAX_HAZARDS = 40;
export const MAX_PEOPLE = 30;
/** Highest floor clearance accepted, m. */
export const MAX_FLOOR_CLEARANCE_M = 50;

export const detailsSchema = z.object({
  sequence: z
    .array(sequenceStepSchema)
    .min(1, "The lift needs at least one step.")
    .max(MAX_STEPS, `At most ${MAX_STEPS} steps.`),
  hazards: z
    .array(z.object({ hazard: requiredText("hazard", 300), control: requiredText("control for the hazard", 1000) }))
    .max(MAX_HAZARDS, `At most ${MAX_HAZARDS} hazards.`),
  exclusionZone: text("exclusion zone", 2000, { multiline: true }),
  communication: text("communication method", 1000, { multiline: true }),
  people: z
    .array(
      z.object({
        name: requiredText("person's name", 120),
        role: z.enum(PERSON_ROLES, { error: "Choose the person's role." }),
      }),
    )
    .max(MAX_PEOPLE, `At most ${MAX_PEOPLE} people.`),
  floorClearanceM: finite("floor clearance")
    .min(0, "The floor clearance cannot be negative.")
    .max(MAX_FLOOR_CLEARANCE_M, `The floor clearance is at most ${MAX_FLOOR_CLEARANCE_M} m.`),
  /** The planned lift date, YYYY-MM-DD: every item must be in date for examination then (and today). */
  liftDate: safeText({ error: "Give the lift date as YYYY-MM-DD." })
    .regex(/^\d{4}-\d{2}-\d{2}$/, "Give the lift date as YYYY-MM-DD.")
    .refine(isIsoDate, "The lift date is not a real date.")
    .optional(),
});
export type PlanDetails = z.infer<typeof detailsSchema>;

// ----- the whole document -----

export const planDocumentSchema = z.object({
  title: requiredText("plan title", MAX_TITLE),
  arrangement: arrangementSchema,
  rigging: riggingAllocationSchema,
  details: detailsSchema,
});
export type PlanDocument = z.infer<typeof planDocumentSchema>;

const coordinate = (label: string) =>
  finite(label)
    .min(-MAX_PLAN_LENGTH_M, `The ${label} is out of range.`)
    .max(MAX_PLAN_LENGTH_M, `The ${label} is out of range.`);
const position = z.object({
  x: coordinate("x coordinate"),
  y: coordinate("y coordinate"),
  z: coordinate("z coordinate"),
});

/**
 * Edits the editor makes to the plan's own copy of the load: where the lift points are, and the planner's
 * override of the mass and CoG (null removes it; absent leaves it as it is). `cog`, when sent, must be the
 * CoG as planned: the CoG follows the component unless the override moves it. The component itself is
 * never changed from a plan.
 */
export const loadEditSchema = z.object({
  cog: position.optional(),
  liftPoints: z.array(z.object({ label: liftPointLabel, position })).max(12, "At most 12 lift points."),
  override: loadOverrideSchema.nullable().optional(),
});
export type LoadEdit = z.infer<typeof loadEditSchema>;

/** A PUT of the document: the version the editor loaded and the editable parts. Anything else (results, figures) is dropped. */
export const planPutSchema = planDocumentSchema.extend({
  version: z
    .number({ error: "Send the version of the plan you loaded." })
    .int()
    .positive("Send the version of the plan you loaded."),
  load: loadEditSchema.optional(),
});

/**
 * The editor's load edits applied to the plan's copy of the component and its override: the copy (lift
 * points moved), the override in force and the load as planned, with issues for lift points the copy does
 * not have, an override that cannot be taken and a CoG moved without one.
 */
export function applyLoadEdit(
  component: ComponentDefinition,
  currentOverride: LoadOverride | null,
  edit: LoadEdit | undefined,
): {
  component: ComponentDefinition;
  override: LoadOverride | null;
  snapshot: ComponentDefinition;
  issues: PlanIssue[];
} {
  if (!edit)
    return { component, override: currentOverride, snapshot: plannedLoad(component, currentOverride), issues: [] };
  const issues: PlanIssue[] = [];
  const moved = new Map(edit.liftPoints.map((p) => [p.label, p.position]));
  const known = new Set(component.liftPoints.map((p) => p.label));
  edit.liftPoints.forEach((p, i) => {
    if (!known.has(p.label))
      issues.push({ path: ["load", "liftPoints", i, "label"], message: `The load has no lift point ${p.label}.` });
  });
  const copy = {
    ...component,
    liftPoints: component.liftPoints.map((p) => ({ ...p, position: moved.get(p.label) ?? p.position })),
  };
  const override = edit.override === undefined ? currentOverride : edit.override;
  if (edit.override) issues.push(...overrideIssues(copy, edit.override));
  const snapshot = plannedLoad(copy, override);
  const cog = edit.cog;
  if (cog && Math.hypot(cog.x - snapshot.cog.x, cog.y - snapshot.cog.y, cog.z - snapshot.cog.z) > 5e-4)
    issues.push({
      path: ["load", "cog"],
      message:
        "The CoG follows the component unless it is overridden with a reason: give the planned CoG and the reason as an override.",
    });
  return { component: copy, override: effectiveOverride(copy, override), snapshot, issues };
}

export type PlanIssue = { path: Array<string | number>; message: string };

export function zodIssues(error: z.ZodError): PlanIssue[] {
  return error.issues.map((i) => ({
    path: i.path.map((p) => (typeof p === "number" ? p : String(p))),
    message: i.message,
  }));
}

/** "arrangement.hookHeightM: The hook height is out of range." */
export function describeIssue(issue: PlanIssue): string {
  const path = issue.path.join(".");
  return path ? `${path}: ${issue.message}` : issue.message;
}

/** Where the document does not fit its load snapshot: unknown lift points, rigging for legs not in use. */
export function snapshotIssues(
  doc: Pick<PlanDocument, "arrangement" | "rigging">,
  snapshot: ComponentDefinition,
): PlanIssue[] {
  const issues: PlanIssue[] = [];
  const known = new Set(snapshot.liftPoints.map((p) => p.label));
  doc.arrangement.liftPointLabels.forEach((label, i) => {
    if (!known.has(label))
      issues.push({ path: ["arrangement", "liftPointLabels", i], message: `The load has no lift point ${label}.` });
  });
  if (doc.rigging.beamItemId !== undefined && doc.arrangement.kind !== "beam")
    issues.push({
      path: ["rigging", "beamItemId"],
      message: "A beam is allocated but the legs go to one hook: choose the beam arrangement or remove the beam.",
    });
  const used = new Set(doc.arrangement.liftPointLabels);
  for (const label of Object.keys(doc.rigging.legs)) {
    if (!used.has(label))
      issues.push({
        path: ["rigging", "legs", label],
        message: `Gear is allocated to leg ${label}, which is not in the arrangement.`,
      });
  }
  return issues;
}

// ----- results, as the server stores them -----

/** One leg of a bridle, or one vertical drop of a beam. */
export type PlanLeg = SolveResponseBody["legs"][number];

export type PlanResultsBody = SolveResponseBody & {
  /** Beam arrangements only: the beam and what it adds at the hook. */
  beam?: {
    massKg: number;
    wllKg: number;
    hookMassKg: number;
    topLegs: PlanLeg[];
    /** The register item the figures come from; absent on a plan whose beam was typed in (not from the register). */
    itemCode?: string;
    /** Where the beam hangs, component frame, m; absent on results stored before beams were placed. */
    placement?: BeamPlacement;
  };
};

/** Results computed by the server on every save; never taken from the browser. */
export type PlanResults = { kind: "bridle" | "beam"; computedOn: string } & (
  | { status: 200; body: PlanResultsBody }
  | { status: 400; body: { error: string; issues: unknown[] } }
  | { status: 422; body: { error: string; code: string } }
);
