// Constants and unit conversions at the edges of the statics core. Display conversions go
// through mathjs units; the exact constants below are checked against mathjs in the tests.
import { unit } from "mathjs";

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

const MATHJS_MASS: Record<MassUnit, string> = { kg: "kg", t: "tonne", lb: "lbm", shortTon: "ton" };
const MATHJS_LENGTH: Record<LengthUnit, string> = { m: "m", mm: "mm", in: "in", ft: "ft" };

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

/** Converts a mass between kg, tonne, lb and US short ton (via mathjs). */
export function convertMass(value: number, from: MassUnit, to: MassUnit): number {
  if (from === to) return value;
  return unit(value, MATHJS_MASS[from]).toNumber(MATHJS_MASS[to]);
}

/** A mass in any supported unit, in kg. */
export function massToKg(value: number, from: MassUnit): number {
  return convertMass(value, from, "kg");
}

/** Converts a length between m, mm, in and ft (via mathjs). */
export function convertLength(value: number, from: LengthUnit, to: LengthUnit): number {
  if (from === to) return value;
  return unit(value, MATHJS_LENGTH[from]).toNumber(MATHJS_LENGTH[to]);
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
