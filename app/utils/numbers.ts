// Numbers as people type them, read in one place: a decimal point or a decimal comma, digits grouped in threes by
// commas, points or spaces ("1,240.5", "1.240,5", "1 240,5"), a sign, and a unit after the number ("2.5 t"). What
// could be read two ways is refused with a sentence saying so, never guessed: "1,240" is 1240 to some and 1.24 to
// others. Pure and small, so forms in the browser can use it too; units are turned into figures by
// utils/quantities.ts on the server.
import { z } from "zod";

/** What was typed, read: the number, or a sentence saying why it was refused. */
export type TypedNumber = { ok: true; value: number } | { ok: false; message: string };

/** A number and the unit typed after it (`null` when none), or why it was refused. */
export type TypedQuantity = { ok: true; value: number; unit: string | null } | { ok: false; message: string };

// No-break, figure, thin and narrow no-break spaces, as copied from documents and spreadsheets.
const SPACE_LIKE = /[\u00a0\u2007\u2009\u202f]/g;
// The minus sign and dashes that word processors put in place of a hyphen.
const MINUS_LIKE = /[\u2212\u2012\u2013]/g;

function refuse(message: string): { ok: false; message: string } {
  return { ok: false, message };
}

function tidy(text: string) {
  return text.replace(SPACE_LIKE, " ").replace(MINUS_LIKE, "-").replace(/ {2,}/g, " ").trim();
}

/** Whether `integer` is digits grouped in threes by `separator` ("1,240,000"): 1-3 digits first, then threes. */
function isGroupedInThrees(integer: string, separator: string) {
  const groups = integer.split(separator);
  return /^\d{1,3}$/.test(groups[0]!) && groups.slice(1).every((g) => /^\d{3}$/.test(g));
}

/**
 * Reads a number typed by a person. Accepts "1240", "-3", "1,240.5", "1.240,5", "1 240,5", "1,5", ".5", "1.2e3";
 * refuses, with a sentence, anything else, including the ambiguous "1,240" and "1.240" (a thousands separator or a
 * decimal one?) and groups not in threes ("1,24,0").
 */
export function readTypedNumber(text: string): TypedNumber {
  const typed = tidy(text);
  if (typed === "") return refuse("Enter a number.");
  const sign = typed[0] === "-" || typed[0] === "+" ? typed[0] : "";
  const body = typed.slice(sign.length);
  if (/^\d+(\.\d+)?e[+-]?\d+$/i.test(body)) return finite(Number(sign + body), typed);
  if (!/^[\d., ]*\d[\d., ]*$/.test(body) || /^ | $/.test(body))
    return refuse(`“${typed}” is not a number: use digits, with a decimal point or comma.`);

  const commas = body.split(",").length - 1;
  const points = body.split(".").length - 1;
  const hasSpaces = body.includes(" ");
  let decimal: "," | "." | null = null;
  let grouping: "," | "." | null = null;
  if (commas && points) {
    decimal = body.lastIndexOf(",") > body.lastIndexOf(".") ? "," : ".";
    grouping = decimal === "," ? "." : ",";
    if ((decimal === "," ? commas : points) > 1)
      return refuse(`“${typed}” has more than one decimal ${decimal === "," ? "comma" : "point"}.`);
  } else if (commas + points > 1) {
    grouping = commas ? "," : ".";
  } else if (commas + points === 1) {
    const separator = commas ? "," : ".";
    const [before, after] = body.split(separator) as [string, string];
    // Three digits after a lone separator, behind digits that could themselves be grouped (and are not a lone 0),
    // read two ways: "1,240" and "1 240.000" are whole numbers to some and fractions to others.
    if (/^\d{3}$/.test(after) && /^\d{1,3}( \d{3})*$/.test(before) && before !== "0") {
      const whole = `${sign === "-" ? "-" : ""}${Number(before.replaceAll(" ", "") + after)}`;
      const fraction = `${sign === "-" ? "-" : ""}${Number(`${before.replaceAll(" ", "")}.${after}`)}`;
      return refuse(`“${typed}” could mean ${whole} or ${fraction}: type ${whole} or ${fraction} to say which.`);
    }
    decimal = separator;
  }

  const [integerPart = "", fractionPart = "", ...more] = decimal ? body.split(decimal) : [body];
  if (more.length) return refuse(`“${typed}” has more than one decimal ${decimal === "," ? "comma" : "point"}.`);
  if (decimal && !/^\d+$/.test(fractionPart))
    return refuse(`“${typed}” needs digits after its decimal ${decimal === "," ? "comma" : "point"}.`);
  if (hasSpaces && grouping)
    return refuse(`“${typed}” groups its digits two ways; use one, e.g. 1 240 000 or 1,240,000.`);
  const separator = hasSpaces ? " " : grouping;
  if (separator && integerPart.includes(separator) && !isGroupedInThrees(integerPart, separator))
    return refuse(`“${typed}” groups its digits unevenly; group them in threes (1,240,000) or not at all.`);
  if (separator === null && !/^\d*$/.test(integerPart)) return refuse(`“${typed}” is not a number.`);
  const digits = separator ? integerPart.split(separator).join("") : integerPart;
  return finite(Number(`${sign}${digits || "0"}${decimal ? `.${fractionPart}` : ""}`), typed);
}

function finite(value: number, typed: string): TypedNumber {
  return Number.isFinite(value) ? { ok: true, value } : refuse(`“${typed}” is too large a number.`);
}

/**
 * Splits "1 240,5 kg", "2.5t", "12 in" or `12"` into the number, read by readTypedNumber, and the unit as typed
 * (trimmed; `null` when there is none). Says nothing yet about whether the unit fits: see utils/quantities.ts.
 */
export function readTypedQuantity(text: string): TypedQuantity {
  const typed = tidy(text);
  // The number runs to its last digit (a trailing exponent included); whatever follows is the unit.
  const match = /^([+-]?[\d., ]*\d(?:e[+-]?\d+)?)\s*(.*)$/i.exec(typed);
  if (!match) return typed === "" ? refuse("Enter a number.") : refuse(`“${typed}” does not start with a number.`);
  const number = readTypedNumber(match[1]!);
  if (!number.ok) return number;
  const unit = match[2]!.trim();
  return { ok: true, value: number.value, unit: unit === "" ? null : unit };
}

/**
 * A zod field for a plain number typed by a person (no unit): "1 240,5" parses to 1240.5, a refusal becomes the
 * field's error. `label` names the field in the messages ("Enter the contingency as a number."); `suffix` is a unit
 * sign that may follow and says nothing ("%").
 */
export function typedNumberField(label: string, options: { suffix?: string } = {}) {
  return z.unknown().transform((input, ctx): number => {
    const text = typeof input === "string" ? input : "";
    const read = text.trim() === "" ? refuse(`Enter the ${label} as a number.`) : readTypedQuantity(text);
    if (read.ok && (read.unit === null || read.unit === options.suffix)) return read.value;
    ctx.issues.push({
      code: "custom",
      input,
      message: read.ok ? `Enter the ${label} as a number, without a unit.` : read.message,
    });
    return z.NEVER;
  });
}
