// Masses and lengths typed with their unit ("1240 kg", "2.5 t", "12 in", "1 240,5 kg"): the number is read by
// utils/numbers.ts and the unit by mathjs's unit parser, so any unit mathjs knows for the quantity works.
//
// Server side only: mathjs is large, so it must never reach a page's JavaScript. Only the form parsers of actions
// import this module (tree-shaking drops it from the browser build, where forms import just their constants), the
// server build bundles the unit code alone (vite.config.ts, ssr.noExternal), and tests/e2e/bundles.e2e.ts fails if
// any browser file carries mathjs.
import { create, unitDependencies, type MathJsInstance } from "mathjs";
import { z } from "zod";
import { convertLength, convertMass, type LengthUnit, type MassUnit } from "~/statics/units";
import { safeText } from "~/utils/forms";
import { readTypedQuantity, type TypedNumber } from "~/utils/numbers";

export type Quantity = "mass" | "length";
type UnitOf<Q extends Quantity> = Q extends "mass" ? MassUnit : LengthUnit;

// How people write the usual units, matched whatever the case ("MM", "Kg", "T"): mathjs's own names are case
// sensitive ("Mm" is a megametre, "T" a tesla), which no one filling in a lift plan means.
const USUAL_SPELLINGS = new Map<string, string>(
  Object.entries({
    mm: "mm",
    cm: "cm",
    m: "m",
    in: "inch",
    inch: "inch",
    inches: "inch",
    '"': "inch",
    ft: "ft",
    foot: "ft",
    feet: "ft",
    "'": "ft",
    g: "g",
    kg: "kg",
    kgs: "kg",
    t: "tonne",
    tonne: "tonne",
    tonnes: "tonne",
    lb: "lbm",
    lbs: "lbm",
    "short ton": "ton",
    "short tons": "ton",
    "sh tn": "ton",
    "us ton": "ton",
    "us tons": "ton",
  }),
);

// Spellings that name different masses in different places; lifting gear is marked in one of them.
const AMBIGUOUS_SPELLINGS = new Map([
  ["ton", "“ton” means 1000 kg, 907 kg or 1016 kg depending on the country: type t for tonnes or short ton."],
  ["tons", "“tons” means 1000 kg, 907 kg or 1016 kg depending on the country: type t for tonnes or short tons."],
]);

const EXAMPLES: Record<Quantity, string> = { mass: "kg, t or lb", length: "mm, m, in or ft" };
const SI: Record<Quantity, string> = { mass: "kg", length: "m" };

let mathjs: MathJsInstance | undefined;
/** A mathjs instance with only the unit functions, made on first use. */
function units(): MathJsInstance {
  if (!mathjs) {
    // Typed as possibly missing (mathjs declares its dependency maps as a Record).
    if (!unitDependencies) throw new Error("mathjs provides no unit functions.");
    mathjs = create({ unitDependencies });
  }
  return mathjs;
}

function refuse(message: string): { ok: false; message: string } {
  return { ok: false, message };
}

/** The mathjs name of the unit `typed`, if it is a unit of `quantity`; else why it is refused. */
function unitNamed(typed: string, quantity: Quantity): { ok: true; name: string } | { ok: false; message: string } {
  const key = typed.toLowerCase().replace(/\s+/g, " ");
  const ambiguous = quantity === "mass" ? AMBIGUOUS_SPELLINGS.get(key) : undefined;
  if (ambiguous) return refuse(ambiguous);
  const usual = USUAL_SPELLINGS.get(key);
  const unknown = refuse(`“${typed}” is not a unit of ${quantity} Plumbline knows: use ${EXAMPLES[quantity]}.`);
  // Else one word of letters (a unit, perhaps with a prefix): no arithmetic, no powers, nothing long to parse.
  if (!usual && !/^[A-Za-z]{1,12}$/.test(typed)) return unknown;
  const name = usual ?? typed;
  const other: Quantity = quantity === "mass" ? "length" : "mass";
  try {
    const unit = units().unit(1, name);
    if (unit.equalBase(units().unit(1, SI[quantity]))) return { ok: true, name };
    if (unit.equalBase(units().unit(1, SI[other])))
      return refuse(`“${typed}” is a unit of ${other}: give the ${quantity} in ${EXAMPLES[quantity]}.`);
    return unknown;
  } catch {
    return unknown;
  }
}

/**
 * Reads a mass or length typed by a person, with or without its unit, as a number of `into`: "2.5 t" is 2500 kg,
 * "12 in" is 0.3048 m, and a bare number is taken in `unitIfNone` (the user's display unit, converted by the exact
 * factors of statics/units.ts without mathjs). A unit of another quantity, an unknown or ambiguous unit ("ton"), or
 * a number read two ways ("1,240") is refused with a sentence.
 */
export function readTypedAmount<Q extends Quantity>(
  text: string,
  quantity: Q,
  unitIfNone: UnitOf<Q>,
  into: UnitOf<Q>,
): TypedNumber {
  const read = readTypedQuantity(text);
  if (!read.ok) return read;
  const fromSi = (value: number) =>
    quantity === "mass" ? convertMass(value, "kg", into as MassUnit) : convertLength(value, "m", into as LengthUnit);
  let value: number;
  if (read.unit === null) {
    value =
      quantity === "mass"
        ? convertMass(read.value, unitIfNone as MassUnit, into as MassUnit)
        : convertLength(read.value, unitIfNone as LengthUnit, into as LengthUnit);
  } else {
    const unit = unitNamed(read.unit, quantity);
    if (!unit.ok) return unit;
    value = fromSi(units().unit(read.value, unit.name).toNumber(SI[quantity]));
  }
  return Number.isFinite(value) ? { ok: true, value } : refuse(`“${text.trim()}” is too large.`);
}

/**
 * A zod field for a mass or length typed with or without a unit, coming out as a number of `into` (kg, t, mm, m).
 * For gear WLLs: `amountField("WLL", "mass", "t", "kg")`. Refusals become the field's error; an empty field says
 * "Enter the <label> as a number.".
 */
export function amountField<Q extends Quantity>(label: string, quantity: Q, unitIfNone: UnitOf<Q>, into: UnitOf<Q>) {
  return z.unknown().transform((input, ctx): number => {
    const text = typeof input === "string" ? input : "";
    const read =
      text.trim() === ""
        ? refuse(`Enter the ${label} as a number.`)
        : readTypedAmount(text, quantity, unitIfNone, into);
    if (read.ok) return read.value;
    ctx.issues.push({ code: "custom", input, message: read.message });
    return z.NEVER;
  });
}

/**
 * As amountField, for a field that may be left empty: empty comes out as null, anything typed is read the same way
 * and must lie from `min` to `max` (in `into`).
 */
export function optionalAmountField<Q extends Quantity>(
  label: string,
  quantity: Q,
  unitIfNone: UnitOf<Q>,
  into: UnitOf<Q>,
  range: { min: number; max: number },
) {
  // Through preprocess, so a field left out of the form (or the CSV row) is read as empty, not as missing.
  const asText = (v: unknown) => (typeof v === "string" ? v : v == null ? "" : String(v));
  return z.preprocess(asText, safeText()).transform((text, ctx): number | null => {
    const input = text;
    if (text.trim() === "") return null;
    const read = readTypedAmount(text, quantity, unitIfNone, into);
    if (!read.ok) {
      ctx.issues.push({ code: "custom", input, message: read.message });
      return z.NEVER;
    }
    if (!(read.value >= range.min && read.value <= range.max)) {
      ctx.issues.push({ code: "custom", input, message: `The ${label} must be from ${range.min} to ${range.max}.` });
      return z.NEVER;
    }
    return read.value;
  });
}

/**
 * Reads a figure as marked on lifting gear in the unit chosen beside it: a bare number is in that unit, and a unit
 * typed after the number must be that same unit ("2.5 t" with t chosen), so the marking is kept as marked and never
 * silently converted. Any other unit, or a number read two ways, is refused with a sentence.
 */
export function readMarkedAmount(text: string, unit: MassUnit, unitLabel: string): TypedNumber {
  const read = readTypedQuantity(text);
  if (!read.ok || read.unit === null) return read;
  const factor = readTypedAmount(`1 ${read.unit}`, "mass", unit, unit);
  if (!factor.ok) return factor;
  if (Math.abs(factor.value - 1) > 1e-9)
    return refuse(
      `“${text.trim()}” is not in ${unitLabel}, the unit chosen for it: choose the unit the item is marked in, or type the figure without a unit.`,
    );
  return { ok: true, value: read.value };
}
