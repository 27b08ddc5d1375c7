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
