// The load as planned: a plan lifts the component's mass and CoG unless the planner overrides either
// with a reason (a weighing on site, a part removed before the lift). The override is kept beside the
// component's own figures in the plan's copy of the load, so every page, the print and the sealed
// record can show both. Pure and shared with the browser.
import { z } from "zod";
import { componentDefinitionSchema, cogOutsideOutline, type ComponentDefinition } from "~/loads/component-definition";
import { safeText } from "~/utils/forms";
import { formatLength, formatMass, type Units } from "~/utils/format";

type Vec3 = { x: number; y: number; z: number };

/** Largest planned mass, kg (as the component form). */
export const MAX_OVERRIDE_MASS_KG = 1_000_000;
/** Longest reason, characters. */
export const MAX_OVERRIDE_REASON = 1000;
/** Differences below these are unit-conversion noise, not an override (as the component comparison). */
const MASS_TOL_KG = 1e-6;
const COG_TOL_M = 5e-4;

const coordinate = (axis: string) =>
  z
    .number({ error: `Give the CoG ${axis} as a number.` })
    .finite(`Give the CoG ${axis} as a number.`)
    .min(-1000, `The CoG ${axis} is out of range.`)
    .max(1000, `The CoG ${axis} is out of range.`);

/** The planner's override of the component's mass and/or CoG (SI: kg, m in the component frame), with the reason. */
export const loadOverrideSchema = z.object({
  massKg: z
    .number({ error: "Give the planned mass as a number." })
    .finite("Give the planned mass as a number.")
    .gt(0, "The mass must be more than zero.")
    .max(MAX_OVERRIDE_MASS_KG, "That mass is over 1,000 t; check the figure and its unit.")
    .nullable()
    .default(null),
  cog: z
    .object({ x: coordinate("x"), y: coordinate("y"), z: coordinate("z") })
    .nullable()
    .default(null),
  reason: safeText({ multiline: true, error: "Give the reason as text." })
    .trim()
    .min(1, "Give the reason for overriding the component's mass or CoG.")
    .max(MAX_OVERRIDE_REASON, `The reason can be at most ${MAX_OVERRIDE_REASON} characters.`),
});
export type LoadOverride = z.infer<typeof loadOverrideSchema>;

export type OverrideIssue = { path: Array<string | number>; message: string };

const sameMass = (a: number, b: number) => Math.abs(a - b) <= MASS_TOL_KG;
const sameCog = (a: Vec3, b: Vec3) => Math.hypot(a.x - b.x, a.y - b.y, a.z - b.z) <= COG_TOL_M;

/** The override with any figure equal to the component's dropped; null when nothing differs. */
export function effectiveOverride(component: ComponentDefinition, override: LoadOverride | null): LoadOverride | null {
  if (!override) return null;
  const massKg = override.massKg !== null && !sameMass(override.massKg, component.massKg) ? override.massKg : null;
  const cog = override.cog && !sameCog(override.cog, component.cog) ? override.cog : null;
  return massKg === null && cog === null ? null : { massKg, cog, reason: override.reason };
}

/**
 * Why an override cannot be taken, with paths under `path`: it changes nothing, or its CoG lies
 * outside the component's outline (the component form's sentence). Empty when it is sound.
 */
export function overrideIssues(
  component: ComponentDefinition,
  override: LoadOverride,
  path: Array<string | number> = ["load", "override"],
): OverrideIssue[] {
  if (override.massKg === null && override.cog === null)
    return [{ path: [...path, "massKg"], message: "An override gives a planned mass, a planned CoG or both." }];
  if (!effectiveOverride(component, override))
    return [
      {
        path: [...path, "massKg"],
        message: "The mass and CoG given are the component's own: there is nothing to override.",
      },
    ];
  if (!override.cog) return [];
  return Object.entries(cogOutsideOutline(override.cog, component)).map(([axis, message]) => ({
    path: [...path, "cog", axis],
    message: message!,
  }));
}

/** The load the plan lifts: the component with the override's mass and CoG where it gives them. */
export function plannedLoad(component: ComponentDefinition, override: LoadOverride | null): ComponentDefinition {
  const o = effectiveOverride(component, override);
  if (!o) return component;
  return { ...component, massKg: o.massKg ?? component.massKg, cog: o.cog ?? component.cog };
}

/** The plan's copy of the load as stored: the component's definition and, under `override`, the planner's override. */
export function storedLoadJson(component: ComponentDefinition, override: LoadOverride | null): string {
  const o = effectiveOverride(component, override);
  return JSON.stringify(o ? { ...component, override: o } : component);
}

/** Reads a stored copy of the load into the component's definition and the override (null when none). */
export function readStoredLoad(json: string): { component: ComponentDefinition; override: LoadOverride | null } {
  const value = JSON.parse(json) as Record<string, unknown>;
  const component = componentDefinitionSchema.parse(value) as ComponentDefinition;
  const parsed = value.override === undefined ? null : loadOverrideSchema.safeParse(value.override);
  return { component, override: parsed?.success ? effectiveOverride(component, parsed.data) : null };
}

/** Where the load as planned differs from the component: both figures of each, and the reason. Kept in the sealed record. */
export type LoadOverrideMark = {
  mass: { componentKg: number; plannedKg: number } | null;
  cog: { component: Vec3; planned: Vec3 } | null;
  reason: string;
};

export function overrideMark(component: ComponentDefinition, override: LoadOverride | null): LoadOverrideMark | null {
  const o = effectiveOverride(component, override);
  if (!o) return null;
  return {
    mass: o.massKg !== null ? { componentKg: component.massKg, plannedKg: o.massKg } : null,
    cog: o.cog ? { component: component.cog, planned: o.cog } : null,
    reason: o.reason,
  };
}

const point = (p: Vec3, units: Units) =>
  `(${formatLength(p.x, units)}, ${formatLength(p.y, units)}, ${formatLength(p.z, units)})`;

/** The mark in sentences, in the user's units: one per figure that differs, then the reason. */
export function overrideSentences(mark: LoadOverrideMark, units: Units): string[] {
  const lines: string[] = [];
  if (mark.mass)
    lines.push(
      `Mass differs from the component: ${formatMass(mark.mass.plannedKg, units)} as planned, ${formatMass(mark.mass.componentKg, units)} on the component.`,
    );
  if (mark.cog)
    lines.push(
      `CoG differs from the component: ${point(mark.cog.planned, units)} as planned, ${point(mark.cog.component, units)} on the component.`,
    );
  lines.push(`Reason for the override: ${mark.reason}`);
  return lines;
}

/**
 * What a change of the override writes to the audit trail: the component's figures, the planned ones
 * before and after, and the reason; null when the override did not change.
 */
export function overrideAuditDetails(
  component: ComponentDefinition,
  before: LoadOverride | null,
  after: LoadOverride | null,
): Record<string, unknown> | null {
  const b = effectiveOverride(component, before);
  const a = effectiveOverride(component, after);
  if (JSON.stringify(b) === JSON.stringify(a)) return null;
  return {
    componentMassKg: component.massKg,
    componentCog: component.cog,
    oldMassKg: b?.massKg ?? component.massKg,
    newMassKg: a?.massKg ?? component.massKg,
    oldCog: b?.cog ?? component.cog,
    newCog: a?.cog ?? component.cog,
    oldReason: b?.reason ?? null,
    reason: a?.reason ?? null,
  };
}
