import { z } from "zod";

/** Where a mass figure came from, most to least trustworthy. */
export const MASS_SOURCES = ["weighed", "certified", "calculated", "estimated"] as const;
export type MassSource = (typeof MASS_SOURCES)[number];

export const MASS_SOURCE_LABELS: Record<MassSource, string> = {
  weighed: "Weighed (load cell or crane scale)",
  certified: "Nameplate or manufacturer's certificate",
  calculated: "Calculated from drawings",
  estimated: "Estimated",
};

/**
 * Default contingency on the mass by its source, in percent (common practice, a judgement
 * rather than a published table: the less certain the figure, the larger the allowance).
 */
export const DEFAULT_CONTINGENCY_PCT: Record<MassSource, number> = {
  weighed: 0,
  certified: 3,
  calculated: 10,
  estimated: 20,
};

export const COG_SOURCES = ["measured", "manufacturer", "calculated", "estimated"] as const;
export type CogSource = (typeof COG_SOURCES)[number];

export const COG_SOURCE_LABELS: Record<CogSource, string> = {
  measured: "Measured (trial lift or weighing at points)",
  manufacturer: "Manufacturer's drawing or data",
  calculated: "Calculated from parts",
  estimated: "Estimated",
};

const finite = z.number().finite();
const point2 = z.tuple([finite, finite]);
const vec3 = z.object({ x: finite, y: finite, z: finite });

/** A component as the statics and the plans see it: SI units (kg, m), component frame with z up. */
export const componentDefinitionSchema = z.object({
  name: z.string(),
  description: z.string(),
  massKg: finite.positive(),
  massSource: z.enum(MASS_SOURCES),
  massNote: z.string(),
  contingencyPct: finite.min(0),
  lengthM: finite.positive(),
  widthM: finite.positive(),
  heightM: finite.positive(),
  cog: vec3,
  cogSource: z.enum(COG_SOURCES),
  cogNote: z.string(),
  /** Largest tilt (deg) at which it can still be guided onto its spigot or dowels; null or absent: none known. */
  fitToleranceDeg: finite.positive().nullable().optional(),
  /** Where the fit tolerance comes from (a drawing, the maker's instructions). */
  fitToleranceSource: z.string().optional(),
  outlineElevation: z.array(point2),
  outlinePlan: z.array(point2),
  liftPoints: z.array(
    z.object({
      label: z.string(),
      position: vec3,
      axis: vec3,
      thread: z.string(),
      engagementMm: finite.nullable(),
    }),
  ),
  parts: z.array(z.object({ name: z.string(), massKg: finite, position: vec3 })),
});

export type ComponentDefinition = z.infer<typeof componentDefinitionSchema>;

/** The default outlines: a box of the overall dimensions, centred on x and y, standing on z = 0. */
export function rectangleOutlines(lengthM: number, widthM: number, heightM: number) {
  const hl = lengthM / 2;
  const hw = widthM / 2;
  return {
    outlineElevation: [
      [-hl, 0],
      [hl, 0],
      [hl, heightM],
      [-hl, heightM],
    ] as Array<[number, number]>,
    outlinePlan: [
      [-hl, -hw],
      [hl, -hw],
      [hl, hw],
      [-hl, hw],
    ] as Array<[number, number]>,
  };
}

/** The extents of a polygon: [min a, max a, min b, max b]. */
export function polygonBounds(points: ReadonlyArray<readonly [number, number]>) {
  const as = points.map((p) => p[0]);
  const bs = points.map((p) => p[1]);
  return { minA: Math.min(...as), maxA: Math.max(...as), minB: Math.min(...bs), maxB: Math.max(...bs) };
}

/** How far a CoG may sit outside the outline's extents before it is refused, m (rounding of typed figures). */
export const COG_OUTLINE_TOLERANCE_M = 0.001;

/**
 * Where a CoG lies outside the extents of the component's outlines, one sentence per axis (the component
 * form's and the plan's load override's wording); empty when it lies within them.
 */
export function cogOutsideOutline(
  cog: { x: number; y: number; z: number },
  outlines: Pick<ComponentDefinition, "outlineElevation" | "outlinePlan">,
): Partial<Record<"x" | "y" | "z", string>> {
  const elevation = polygonBounds(outlines.outlineElevation);
  const plan = polygonBounds(outlines.outlinePlan);
  const inside = (v: number, min: number, max: number) =>
    v >= min - COG_OUTLINE_TOLERANCE_M && v <= max + COG_OUTLINE_TOLERANCE_M;
  const out: Partial<Record<"x" | "y" | "z", string>> = {};
  const say = (axis: "x" | "y" | "z") =>
    `The CoG lies outside the component's outline along ${axis}; check the figure and the datum.`;
  if (!inside(cog.x, Math.min(elevation.minA, plan.minA), Math.max(elevation.maxA, plan.maxA))) out.x = say("x");
  if (!inside(cog.y, plan.minB, plan.maxB)) out.y = say("y");
  if (!inside(cog.z, elevation.minB, elevation.maxB)) out.z = say("z");
  return out;
}
