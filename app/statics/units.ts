// Constants and unit conversions at the edges of the statics core. Conversions multiply by the
// exact definitions below; units.test.ts checks every factor against mathjs's units, which stay
// out of the bundles (mathjs alone was 63 KB gzipped on every page that formats a mass or length).

/** Standard gravity in m/s^2 (exact, 3rd CGPM 1901). */
export const STANDARD_GRAVITY_MS2 = 9.80665;
/** One avoirdupois pound in kg (exact, international yard and pound agreement 1959). */
export const POUND_KG = 0.45359237;
/** One US short ton (2000 lb) in kg (exact). */
export const SHORT_TON_KG = 2000 * POUND_KG;
/** One pound-force in newtons (exact: 1 lb x standard gravity). */
export const POUND_FORCE_N = POUND_KG * STANDARD_GRAVITY_MS2;

export type MassUnit = "kg" | "t" | "lb" | "shortTon";
export type LengthUnit = "m" | "mm" | "in" | "ft";

/** Each unit in kg (exact). */
export const MASS_UNIT_KG: Record<MassUnit, number> = { kg: 1, t: 1000, lb: POUND_KG, shortTon: SHORT_TON_KG };
/** Each unit in m (exact: 1 in = 25.4 mm, international yard 1959). */
export const LENGTH_UNIT_M: Record<LengthUnit, number> = { m: 1, mm: 0.001, in: 0.0254, ft: 0.3048 };

/** Weight in kN of a mass in kg under standard gravity. */
export function massKgToWeightKn(massKg: number): number {
  return (massKg * STANDARD_GRAVITY_MS2) / 1000;
}

/** Force in kN expressed as kilograms-force (kgf). */
export function forceKnToKgf(forceKn: number): number {
  return (forceKn * 1000) / STANDARD_GRAVITY_MS2;
}

/** Kilograms-force expressed as kN. */
export function kgfToForceKn(forceKgf: number): number {
  return (forceKgf * STANDARD_GRAVITY_MS2) / 1000;
}

/** Converts a mass between kg, tonne, lb and US short ton. */
export function convertMass(value: number, from: MassUnit, to: MassUnit): number {
  if (from === to) return value;
  return (value * MASS_UNIT_KG[from]) / MASS_UNIT_KG[to];
}

/** A mass in any supported unit, in kg. */
export function massToKg(value: number, from: MassUnit): number {
  return convertMass(value, from, "kg");
}

/** Converts a length between m, mm, in and ft. */
export function convertLength(value: number, from: LengthUnit, to: LengthUnit): number {
  if (from === to) return value;
  return (value * LENGTH_UNIT_M[from]) / LENGTH_UNIT_M[to];
}

/** Rounds x up (toward +infinity) to the given decimals, for display of utilisations; never rounds down. */
export function ceilTo(x: number, decimals: number): number {
  if (!Number.isFinite(x)) return x;
  const factor = 10 ** decimals;
  // toPrecision strips binary noise (0.3 * 100 = 30.000000000000004) before the ceiling.
  const scaled = Number((x * factor).toPrecision(15));
  return Math.ceil(scaled) / factor;
}

/** Load angle factor 1 / sin(theta) for a leg at theta degrees from the horizontal (0 < theta <= 90). */
export function loadAngleFactor(angleFromHorizontalDeg: number): number {
  return 1 / Math.sin((angleFromHorizontalDeg * Math.PI) / 180);
}
