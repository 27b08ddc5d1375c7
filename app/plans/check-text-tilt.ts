// The load's tilt for fitting, and the leg changes that would level it, in words. Pure and shared with
// the browser; check-text.ts calls these for the fit-tilt check and its fix.
import type { Check } from "~/statics/check-types";
import { SMALLEST_LEG_CHANGE_M } from "~/statics/tilt";
import { formatAngle, formatLength, formatLengthUp, type Units } from "~/utils/format";

/** Leg changes smaller than this (m) are shown as no change: below what a rigger can set. */
export const LEVELLING_STEP_M = SMALLEST_LEG_CHANGE_M;

/** A level lift's other way out of an item over its rating: ", or raise the hook point to at least 1,482 mm". */
export function orRaise(hookZM: number | undefined, units: Units): string {
  return hookZM === undefined
    ? ""
    : `, or raise the hook point to at least ${formatLengthUp(hookZM, units)} (component frame)`;
}

/** A leg change as an instruction: "shorten leg C by 12 mm", "lengthen leg A by 3 mm" (nearest mm or 0.01 in). */
export function legChangeText(legId: string, changeM: number, units: Units): string {
  return `${changeM < 0 ? "shorten" : "lengthen"} leg ${legId} by ${formatLength(Math.abs(changeM), units)}`;
}

/** Every leg change of a levelling fix, joined: "shorten leg C by 12 mm and leg D by 4 mm". */
export function levelLegsText(legs: ReadonlyArray<{ legId: string; changeM: number }>, units: Units): string {
  const parts = legs.map((l) => legChangeText(l.legId, l.changeM, units));
  const joined = parts.length <= 1 ? (parts[0] ?? "") : `${parts.slice(0, -1).join(", ")} and ${parts.at(-1)}`;
  return `${joined} to hang the load level`;
}

/** The tilt check as a sentence, with the fix when it fails. */
export function tiltSentence(check: Check, fix: string | null): string {
  const t = check.inputs.tilt;
  if (!t) return `${check.item}.`;
  const along = formatAngle(Math.abs(t.alongLengthDeg));
  const across = formatAngle(Math.abs(t.acrossWidthDeg));
  const tolerance = `${formatAngle(t.toleranceDeg)}${t.toleranceFrom === "common-practice" ? " (common practice; none recorded for the component)" : ""}`;
  const hangs = `The load hangs ${along} out of level along its length and ${across} across its width`;
  if (check.finding === "tilt-over")
    return `${hangs}, beyond its fit tolerance of ${tolerance}: it cannot be guided onto its spigot or dowels without risk to a seal${fix ? `: ${fix}` : ""}.`;
  return `${hangs}, within its fit tolerance of ${tolerance}.`;
}

/** The figures the tilt rule used. */
export function tiltRuleFigures(check: Check): string[] {
  const t = check.inputs.tilt;
  if (!t) return [];
  return [
    `along the length ${formatAngle(t.alongLengthDeg)}, across the width ${formatAngle(t.acrossWidthDeg)}`,
    `fit tolerance ${formatAngle(t.toleranceDeg)} (${t.toleranceFrom === "component" ? "the component's" : "common practice"})`,
  ];
}
