import { convertLength, convertMass, massToKg, POUND_FORCE_N, type MassUnit } from "~/statics/units";

/** A user's unit preference: metric (mm, kg) or imperial (in, lb). */
export type Units = "metric" | "imperial";

export function lengthUnitLabel(units: Units) {
  return units === "metric" ? "mm" : "in";
}

export function massUnitLabel(units: Units) {
  return units === "metric" ? "kg" : "lb";
}

/** A length in metres, in the user's display unit (mm or in). */
export function toDisplayLength(m: number, units: Units) {
  return convertLength(m, "m", units === "metric" ? "mm" : "in");
}

/** A length typed in the user's display unit, in metres. */
export function fromDisplayLength(value: number, units: Units) {
  return convertLength(value, units === "metric" ? "mm" : "in", "m");
}

export function toDisplayMass(kg: number, units: Units) {
  return convertMass(kg, "kg", units === "metric" ? "kg" : "lb");
}

export function fromDisplayMass(value: number, units: Units) {
  return convertMass(value, units === "metric" ? "kg" : "lb", "kg");
}

/** A number for an input field: enough digits to round-trip what was typed, no binary noise. */
export function inputNumber(value: number, decimals = 3) {
  return String(Number(value.toFixed(decimals)));
}

// toLocaleString with options builds a new Intl.NumberFormat on every call (a plan page formats hundreds).
const formatters = new Map<number, Intl.NumberFormat>();
function grouped(value: number, decimals: number) {
  let format = formatters.get(decimals);
  if (!format)
    formatters.set(
      decimals,
      (format = new Intl.NumberFormat("en-GB", { minimumFractionDigits: decimals, maximumFractionDigits: decimals })),
    );
  return format.format(value);
}

/** "1,250 mm" or "49.21 in". */
export function formatLength(m: number, units: Units) {
  return units === "metric"
    ? `${grouped(toDisplayLength(m, units), 0)} mm`
    : `${grouped(toDisplayLength(m, units), 2)} in`;
}

/** "2,000 kg" or "4,409 lb". */
export function formatMass(kg: number, units: Units) {
  return `${grouped(toDisplayMass(kg, units), kg < 10 ? 1 : 0)} ${massUnitLabel(units)}`;
}

// ----- figures that carry a safety direction: loads up, capacities down -----

// 12 significant digits strip binary noise (1.15 * 1000 = 1149.9999999999998) before rounding.
function clean(x: number) {
  return Number(x.toPrecision(12));
}

/** x rounded up (toward +infinity) to `decimals`. */
export function roundUp(x: number, decimals: number) {
  const f = 10 ** decimals;
  return Math.ceil(clean(x * f)) / f;
}

/** x rounded down (toward -infinity) to `decimals`. */
export function roundDown(x: number, decimals: number) {
  const f = 10 ** decimals;
  return Math.floor(clean(x * f)) / f;
}

function massText(value: number, units: Units, direction: "up" | "down") {
  const decimals = Math.abs(value) < 10 ? 1 : 0;
  const shown = direction === "up" ? roundUp(value, decimals) : roundDown(value, decimals);
  return `${grouped(shown, decimals)} ${massUnitLabel(units)}`;
}

/** A load or tension as a mass, rounded up: "1,650 kg" or "3,636 lb". */
export function formatLoad(kg: number, units: Units) {
  return massText(toDisplayMass(kg, units), units, "up");
}

/** A capacity (WLL, SWL, derated figure), rounded down: "1,149 kg" or "2,533 lb". */
export function formatCapacity(kg: number, units: Units) {
  return massText(toDisplayMass(kg, units), units, "down");
}

/** A force, rounded up: "16.18 kN" or "3,636 lbf". */
export function formatForce(kn: number, units: Units) {
  if (units === "metric") return `${grouped(roundUp(kn, 2), 2)} kN`;
  return `${grouped(roundUp(convertForceKnToLbf(kn), 0), 0)} lbf`;
}

function convertForceKnToLbf(kn: number) {
  return (kn * 1000) / POUND_FORCE_N;
}

const MARKED_UNIT_TEXT: Record<MassUnit, string> = { kg: "kg", t: "t", lb: "lb", shortTon: "US ton" };

/**
 * A WLL as marked on the item ("1 t", "3.25 US ton"), with its value in the user's units beside it
 * (rounded down) when the marking is in another unit: "1 t (2,204 lb)".
 */
export function formatMarkedWll(wll: { value: number; unit: MassUnit }, units: Units) {
  const marked = `${grouped(wll.value, Number.isInteger(wll.value) ? 0 : Math.min(3, decimalsOf(wll.value)))} ${MARKED_UNIT_TEXT[wll.unit]}`;
  const userUnit = units === "metric" ? "kg" : "lb";
  if (wll.unit === userUnit) return marked;
  return `${marked} (${formatCapacity(massToKg(wll.value, wll.unit), units)})`;
}

function decimalsOf(x: number) {
  const text = String(clean(x));
  const dot = text.indexOf(".");
  return dot < 0 ? 0 : text.length - dot - 1;
}

/** A length that is a minimum to reach, rounded up: "1,235 mm" or "48.62 in". */
export function formatLengthUp(m: number, units: Units) {
  return units === "metric"
    ? `${grouped(roundUp(toDisplayLength(m, units), 0), 0)} mm`
    : `${grouped(roundUp(toDisplayLength(m, units), 2), 2)} in`;
}

/** A length that is an available maximum, rounded down. */
export function formatLengthDown(m: number, units: Units) {
  return units === "metric"
    ? `${grouped(roundDown(toDisplayLength(m, units), 0), 0)} mm`
    : `${grouped(roundDown(toDisplayLength(m, units), 2), 2)} in`;
}

/** A utilisation as a percentage, never rounded down: "15 %"; "—" when there is none; "no capacity" when infinite. */
export function formatUtilisation(u: number | null | undefined) {
  if (u === null || u === undefined || Number.isNaN(u)) return "—";
  if (!Number.isFinite(u)) return "no capacity";
  return `${grouped(roundUp(u * 100, 0), 0)} %`;
}

/** An angle in degrees to one decimal: "45.0°". */
export function formatAngle(deg: number) {
  return `${deg.toFixed(1)}°`;
}
