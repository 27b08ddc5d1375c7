import type { Vec3 } from "./vector";

export interface CompositePart {
  name: string;
  massKg: number;
  position: Vec3;
}

export interface CompositeResult {
  massKg: number;
  cog: Vec3;
  /** The first moments sum(m_i r_i) in kg m, shown so the planner can follow the sum. */
  momentKgM: Vec3;
}

/** Total mass (kg) and centre of gravity (m) of parts: G = sum(m_i r_i) / sum(m_i). Null when the total mass is not positive. */
export function compositeMassAndCog(parts: readonly CompositePart[]): CompositeResult | null {
  let massKg = 0;
  let mx = 0;
  let my = 0;
  let mz = 0;
  for (const part of parts) {
    massKg += part.massKg;
    mx += part.massKg * part.position.x;
    my += part.massKg * part.position.y;
    mz += part.massKg * part.position.z;
  }
  if (!(massKg > 0) || !Number.isFinite(massKg)) return null;
  return { massKg, cog: { x: mx / massKg, y: my / massKg, z: mz / massKg }, momentKgM: { x: mx, y: my, z: mz } };
}

/**
 * How far the parts' sum may be from the component's own figures before the calculator warns (common practice,
 * not a published limit): a mass within 2 % (the usual spread of drawing masses, paint, fluids and fixings left
 * out of a parts list), and a CoG within 5 mm (a few mm: the rounding of positions read off a drawing).
 */
export const COMPOSITE_MASS_TOLERANCE = 0.02;
export const COMPOSITE_COG_TOLERANCE_M = 0.005;

export type CompositeDisagreement =
  | { kind: "mass"; partsKg: number; componentKg: number; /** (parts - component) / component */ difference: number }
  | { kind: "cog"; parts: Vec3; component: Vec3; /** |G_parts - G_component|, m */ distanceM: number };

/**
 * Where the parts' total mass or combined CoG disagrees with the component's own mass or CoG beyond the
 * tolerances above; empty when they agree (or when the component's figure is not given).
 */
export function compositeDisagreements(
  composite: CompositeResult,
  component: { massKg: number | null; cog: Vec3 | null },
): CompositeDisagreement[] {
  const out: CompositeDisagreement[] = [];
  const { massKg, cog } = component;
  if (massKg !== null && massKg > 0) {
    const difference = (composite.massKg - massKg) / massKg;
    if (Math.abs(difference) > COMPOSITE_MASS_TOLERANCE)
      out.push({ kind: "mass", partsKg: composite.massKg, componentKg: massKg, difference });
  }
  if (cog !== null) {
    const distanceM = Math.hypot(composite.cog.x - cog.x, composite.cog.y - cog.y, composite.cog.z - cog.z);
    if (distanceM > COMPOSITE_COG_TOLERANCE_M)
      out.push({ kind: "cog", parts: composite.cog, component: cog, distanceM });
  }
  return out;
}
