import { convertLength, convertMass } from "~/statics/units";

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
