// Checks in words: the one place a structured check becomes a sentence, in the user's units.
// Loads and requirements are rounded up, capacities down, and a utilisation is never rounded down.
// Pure and shared with the browser.
import type { Check, CheckResult, Fix, GrossLoad, Verdict } from "~/statics/check-types";
import type { Hitch, RuleSetId } from "~/statics/reference";
import {
  formatAngle,
  formatCapacity,
  formatLengthDown,
  formatLengthUp,
  formatLoad,
  formatMarkedWll,
  formatUtilisation,
  type Units,
} from "~/utils/format";
import { levelLegsText, orRaise, tiltRuleFigures, tiltSentence } from "./check-text-tilt";

/** A check as stored before checks were structured: only the old fields. */
export type LegacyCheck = {
  id: string;
  item: string;
  status: Verdict;
  utilisation: number | null;
  loadKg: number | null;
  capacityKg: number | null;
  rule: string;
  source: string;
  message: string;
};

/** Anything a plan or /api/solve may hold as a check. */
export type AnyCheck = Check | CheckResult | LegacyCheck;

export const VERDICT_LABELS: Record<Verdict, string> = { pass: "Pass", warn: "Warn", fail: "Fail" };

export const RULE_SET_NAMES: Record<RuleSetId, string> = { "uk-eu": "UK / EU rules", us: "US rules" };

export const RANK: Record<Verdict, number> = { pass: 0, warn: 1, fail: 2 };

export function isStructured(check: AnyCheck): check is Check {
  return "kind" in check && "verdict" in check;
}

export function verdictOf(check: AnyCheck): Verdict {
  return isStructured(check) ? check.verdict : check.status;
}

/** The worst verdict of a list (pass when empty). */
export function worstVerdict(checks: readonly AnyCheck[]): Verdict {
  return checks.reduce<Verdict>((worst, c) => (RANK[verdictOf(c)] > RANK[worst] ? verdictOf(c) : worst), "pass");
}

/** Whether a check rates an item of gear (not a sling angle or the load's tilt, which the geometry alone decides). */
export function isGearCheck(check: AnyCheck): boolean {
  return isStructured(check)
    ? check.kind !== "leg-angle" && check.kind !== "load-tilt"
    : !check.id.startsWith("angle-");
}

/**
 * How a plan or a leg stands: "unchecked" while no gear is allocated to check (only angles were judged),
 * unless an angle already warns or fails; otherwise the worst verdict. A bare angle pass never shows green.
 */
export function standing(checks: readonly AnyCheck[], leg?: string): Verdict | "unchecked" {
  const scoped = leg === undefined ? checks : checks.filter((c) => onLeg(c, leg));
  const worst = worstVerdict(scoped);
  return scoped.some(isGearCheck) || worst !== "pass" ? worst : "unchecked";
}

function onLeg(c: AnyCheck, leg: string): boolean {
  return isStructured(c) ? c.position.legs.includes(leg) : c.id.endsWith(`-${leg}`);
}

/** The worst verdict among the checks on one leg, or null when none. */
export function worstVerdictForLeg(checks: readonly AnyCheck[], leg: string): Verdict | null {
  const legChecks = checks.filter((c) => onLeg(c, leg));
  return legChecks.length ? worstVerdict(legChecks) : null;
}

const deg = (x: number) => formatAngle(x);
const hitchWord = (h: Hitch) => (h === "straight" ? "straight" : h === "choke" ? "choke" : "basket");
const list = (words: string[]) =>
  words.length <= 1 ? (words[0] ?? "") : `${words.slice(0, -1).join(", ")} or ${words[words.length - 1]}`;

/** What the capacity is, for the sentence: "single-leg WLL in a choke hitch", "SWL". */
function capacityName(check: Check): string {
  const i = check.inputs;
  switch (check.kind) {
    case "sling-leg":
      return i.hitch && i.hitch !== "straight" ? `WLL in a ${hitchWord(i.hitch)} hitch` : "single-leg WLL";
    case "sling-assembly":
      return `sling WLL with ${i.effectiveLegs ?? 1} leg${(i.effectiveLegs ?? 1) > 1 ? "s" : ""} carrying`;
    case "eyebolt":
      return "WLL at this angle";
    case "shackle":
      return i.sideLoadAngleDeg && i.sideLoadAngleDeg > 0 ? "WLL with this side load" : "WLL";
    case "crane-load":
      return "SWL";
    case "beam":
      return "marked WLL";
    default:
      return "WLL";
  }
}

/** What a larger item must be, for the fix sentence. */
function largerItem(check: Check | null, minKg: string): string {
  switch (check?.kind) {
    case "sling-leg":
      return `a sling with a single-leg WLL of at least ${minKg}`;
    case "sling-assembly":
      return `sling legs with a single-leg WLL of at least ${minKg}, or change the rigging`;
    case "eyebolt":
      return `an eyebolt rated at least ${minKg} in line (a larger lift point), or a leg nearer the bolt's axis`;
    case "shackle":
    case "shared-shackle":
      return `a shackle with a WLL of at least ${minKg}`;
    case "master-link":
      return `a master link with a WLL of at least ${minKg}`;
    case "crane-load":
      return `a crane or hoist with an SWL of at least ${minKg}`;
    case "beam":
      return `a beam with a WLL of at least ${minKg}`;
    default:
      return `an item with a WLL of at least ${minKg}`;
  }
}

/** The fix the product computed, as an instruction in the user's units ("raise the hook point to at least 1,235 mm"). */
export function fixText(fix: Fix, units: Units, check: Check | null = null): string {
  switch (fix.kind) {
    case "raise-hook":
      return `raise the hook point to at least ${formatLengthUp(fix.minHookZM, units)} (component frame), with longer legs to match`;
    case "longer-legs":
      return `lengthen ${fix.legs.map((l) => `leg ${l.legId} to at least ${formatLengthUp(l.minLengthM, units)}`).join(", ")} (roughly: the load re-settles), or use a beam`;
    case "larger-item":
      return `use ${largerItem(check, formatLoad(fix.minWllKg, units))}${orRaise(fix.orRaiseHookToZM, units)}`;
    case "tapped-size":
      return `use ${/^[aefhilmnorsx]/i.test(fix.thread) ? "an" : "a"} ${fix.thread} eyebolt to fit the tapped hole`;
    case "tapped-size-limit":
      return `eyebolt ${fix.thread} is the tapped size: use a lifting point of higher WLL (at least ${formatLoad(fix.minWllKg, units)} in line) or more legs${orRaise(fix.orRaiseHookToZM, units)}`;
    case "level-legs":
      return levelLegsText(fix.legs, units);
    case "hitch":
      return `use a ${list(fix.allowed.map(hitchWord))} hitch, the only ${fix.allowed.length === 1 ? "one" : "ones"} this sling and attachment can make`;
    case "state-wll":
      return "state its marked WLL (or its size or colour) so it can be checked";
    case "face-eye-to-pull":
      return "turn the eye to face the pull (shim the collar) or use a swivel lifting point";
    case "collar-or-shoulder-eyebolt":
      return "use a collar or shoulder eyebolt, or a vertical leg";
    case "lead-away-from-surface":
      return "re-rig so the leg leads away from the surface";
    case "confirm-thread":
      return "record the lift point's thread, or confirm the eyebolt fits its hole with full engagement";
    case "tabulated-size":
      return "give a size the table lists";
    case "shackle-per-leg":
      return "use longer legs, or a shackle per leg on a master link";
    case "more-headroom":
      return `find ${formatLengthUp(fix.shortfallM, units)} more: shorten the legs, use a beam, or lift with a different crane`;
    case "examine-before":
      return `have it thoroughly examined before ${fix.dateIso}, or allocate another item`;
    case "replace-item":
      return "allocate another item; the plan cannot be approved with it";
    case "record-examination":
      return "record its last thorough examination, or allocate another item";
    case "record-masses":
      return `record the mass of ${list(fix.items)} on the item`;
  }
}

function withFix(sentence: string, check: Check, units: Units, fallback: string): string {
  const instruction = check.fix ? fixText(check.fix, units, check) : fallback;
  return instruction ? `${sentence}: ${instruction}.` : `${sentence}.`;
}

function eyeNote(check: Check): string {
  const i = check.inputs;
  switch (i.eyeAlignment) {
    case "set-to-pull":
      return ` Its eye is set to face the pull when screwed home (${i.family === "collar" ? "collar" : "shoulder"} seated, shimmed where needed).`;
    case "planner":
      return ` Its eye lies along ${i.eyePlane} as the planner set it; the pull is ${deg(i.outOfPlaneDeg ?? 0)} out of that plane.`;
    default:
      return "";
  }
}

function sideLoadNote(check: Check): string {
  const i = check.inputs;
  const angle = deg(i.sideLoadAngleDeg ?? 0);
  switch (i.sideLoadFrom) {
    case "eye-plane":
      return ` Side load ${angle}, from the pull against the eyebolt's eye.`;
    case "lug-plane":
      return ` Side load ${angle}, from the pull against the lug's plane.`;
    case "lug-assumed":
      return " Side load taken as none: the lug's plane is not recorded, so it is taken to lie along the pull; set it on the plan if it does not.";
    case "given":
      return ` Side load ${angle}, as given.`;
    default:
      return "";
  }
}

function inspectionText(check: Check, units: Units): string {
  const x = check.inputs.inspection;
  const dates = x
    ? ` (today ${x.todayIso}${x.liftDateIso ? `; lift planned for ${x.liftDateIso}` : "; no lift date set"})`
    : "";
  const due = x?.examinationDue ?? "";
  switch (check.finding) {
    case "quarantined":
    case "withdrawn":
      return withFix(`${check.item} is ${check.finding}`, check, units, "");
    case "no-due-date":
      return withFix(`${check.item} has no thorough examination on record`, check, units, "");
    case "overdue":
      return withFix(
        `${check.item} was due for thorough examination on ${due} and is overdue${dates}`,
        check,
        units,
        "",
      );
    case "overdue-at-lift":
      return withFix(
        `${check.item} is in date today but due for thorough examination on ${due}, before the planned lift${dates}`,
        check,
        units,
        "",
      );
    case "due-soon":
      return `${check.item} is due for thorough examination on ${due}, within ${x?.warnDays ?? 30} days${dates}.`;
    default:
      return `${check.item} is in service and in date until ${due}${dates}.`;
  }
}

/** A solver's warning in the reader's units: the core writes its figures as loads in whole kg ("up to 1190 kg"). */
export function warningSentence(warning: { message: string }, units: Units): string {
  if (units === "metric") return warning.message;
  return warning.message.replace(/(\d+(?:\.\d+)?) kg\b/g, (_, kg: string) => formatLoad(Number(kg), units));
}

/**
 * The check's finding as a sentence in the user's units, naming the item, with the fix where it
 * fails or warns. withUtilisation adds "(n %)" for places that show no separate utilisation.
 */
export function checkSentence(check: AnyCheck, units: Units, options: { withUtilisation?: boolean } = {}): string {
  if (!isStructured(check)) return check.message;
  const i = check.inputs;
  const pct = options.withUtilisation && check.utilisation !== null ? ` (${formatUtilisation(check.utilisation)})` : "";
  const load = check.loadKg !== null ? formatLoad(check.loadKg, units) : "";
  const capacity = check.capacityKg !== null ? formatCapacity(check.capacityKg, units) : "";
  switch (check.finding) {
    case "vertical":
      return `${check.item} hangs ${deg(i.angleFromVerticalDeg ?? 0)} from vertical and counts as a vertical leg.`;
    case "angle-ok":
      return `${check.item} hangs ${deg(i.angleFromVerticalDeg ?? 0)} from vertical (${deg(90 - (i.angleFromVerticalDeg ?? 0))} from horizontal).`;
    case "angle-warn":
      return withFix(
        `${check.item} hangs ${deg(i.angleFromVerticalDeg ?? 0)} from vertical, over ${i.limits?.warnDeg ?? 45}°: the sling's rating drops and the leg pulls harder`,
        check,
        units,
        "longer legs would lower the leg loads",
      );
    case "angle-fail":
      return withFix(
        `${check.item} hangs ${deg(i.angleFromVerticalDeg ?? 0)} from vertical (${deg(90 - (i.angleFromVerticalDeg ?? 0))} from horizontal), beyond ${i.limits?.maxDeg ?? 60}°`,
        check,
        units,
        "use longer legs or a beam",
      );
    case "no-mode-factor":
      return withFix(
        `The ${check.item} has a leg ${deg(i.angleFromVerticalDeg ?? 0)} from vertical, beyond ${i.modeUpToDeg ?? 60}°, where it has no rating`,
        check,
        units,
        "use longer legs",
      );
    case "hitch-impossible":
      return withFix(
        `${check.item}: a ${hitchWord(i.hitch ?? "straight")} hitch cannot be made with this sling and what it attaches to, so it is rated as straight (${load} on ${capacity})${pct}`,
        check,
        units,
        "",
      );
    case "no-wll":
      return withFix(
        check.kind === "sling-assembly"
          ? `The ${check.item} has a leg with no known WLL`
          : `${check.item} has no known WLL`,
        check,
        units,
        "",
      );
    case "thread-mismatch":
      return withFix(
        `${check.item} does not fit lift point ${check.position.legs[0] ?? ""}, which is tapped ${i.liftPointThread ?? ""}`,
        check,
        units,
        "",
      );
    case "pull-behind":
      return withFix(
        `${check.item} would be pulled ${deg(i.axisAngleDeg ?? 0)} from its axis, back toward the surface`,
        check,
        units,
        "",
      );
    case "plain-angled":
      return withFix(
        `${check.item} is pulled ${deg(i.axisAngleDeg ?? 0)} off its axis; a plain eyebolt takes in-line pull only`,
        check,
        units,
        "",
      );
    case "out-of-plane":
      return withFix(
        `${check.item} is pulled ${deg(i.axisAngleDeg ?? 0)} off its axis and ${deg(i.outOfPlaneDeg ?? 0)} out of the plane of its eye${i.eyeAlignment === "planner" ? ` (set along ${i.eyePlane} by the planner)` : ""}`,
        check,
        units,
        "",
      );
    case "not-in-table":
      return withFix(
        `${check.item}: thread ${i.thread ?? ""} is not in the DIN 580 table, so its angled rating is unknown`,
        check,
        units,
        "",
      );
    case "beyond-table":
      return withFix(
        check.kind === "shackle"
          ? `${check.item} is side-loaded ${deg(i.sideLoadAngleDeg ?? 0)}, beyond the table`
          : `${check.item} is pulled ${deg(i.axisAngleDeg ?? 0)} from its axis, beyond the table`,
        check,
        units,
        "",
      );
    case "included-angle":
      return withFix(
        `${check.item} has the legs ${deg(i.includedAngleDeg ?? 0)} apart, over ${i.maxIncludedDeg ?? 120}°`,
        check,
        units,
        "",
      );
    case "headroom-short":
      return withFix(
        `Crane hook headroom: the hook must reach ${formatLengthUp(i.neededHookHeightM ?? 0, units)} above the floor but can reach only ${formatLengthDown(i.maxHookHeightM ?? 0, units)}`,
        check,
        units,
        "",
      );
    case "in-date":
    case "due-soon":
    case "overdue":
    case "overdue-at-lift":
    case "quarantined":
    case "withdrawn":
    case "no-due-date":
      return inspectionText(check, units);
    case "over":
      return withFix(
        `${check.item} would carry ${load} but is good for only ${capacity} ${capacityName(check)}${pct}`,
        check,
        units,
        "use a larger item or change the rigging",
      );
    case "thread-unrecorded":
      return `${check.item} carries ${load} of its ${capacity} ${capacityName(check)}${pct}.${eyeNote(check)} The lift point's thread is not recorded: ${fixText({ kind: "confirm-thread" }, units)}.`;
    case "masses-unrecorded":
      return `${check.item} carries ${load} of its ${capacity} ${capacityName(check)}${pct}, not counting ${list(i.gross?.unrecorded ?? [])}, whose mass is not recorded: record it on the item.`;
    case "tilt-ok":
    case "tilt-over":
      return tiltSentence(check, check.fix ? fixText(check.fix, units, check) : null);
    case "within":
      if (check.kind === "crane-headroom") {
        return `Crane hook headroom: the hook must reach ${formatLengthUp(i.neededHookHeightM ?? 0, units)} above the floor and can reach ${formatLengthDown(i.maxHookHeightM ?? 0, units)}.`;
      }
      return `${check.item} carries ${load} of its ${capacity} ${capacityName(check)}${pct}.${check.kind === "eyebolt" ? eyeNote(check) : ""}${check.kind === "shackle" ? sideLoadNote(check) : ""}`;
  }
}

function grossText(g: GrossLoad, units: Units): string {
  const parts = [
    `${formatLoad(g.massKg, units)} x ${(1 + g.contingencyPct / 100).toFixed(2)} contingency = ${formatLoad(g.loadWithContingencyKg, units)}`,
  ];
  for (const item of g.items)
    parts.push(`${item.item}${item.code ? ` ${item.code}` : ""} ${formatLoad(item.massKg, units)}`);
  if (g.riggingMassKg > 0) parts.push(`rigging ${formatLoad(g.riggingMassKg, units)}`);
  if (g.beamMassKg > 0) parts.push(`beam ${formatLoad(g.beamMassKg, units)}`);
  return parts.join(" + ");
}

/** The rule as applied, with its figures in the user's units, and the rule set that gave it. */
export function ruleText(check: AnyCheck, units: Units): string {
  if (!isStructured(check)) return check.rule;
  const i = check.inputs;
  const wll = i.markedWll
    ? `marked ${formatMarkedWll(i.markedWll, units)}`
    : i.wllKg !== undefined
      ? formatCapacity(i.wllKg, units)
      : "";
  const figures: string[] = [];
  switch (check.kind) {
    case "sling-leg":
      if (i.wllKg !== undefined)
        figures.push(
          `single-leg WLL ${i.wllFrom === "assembly" ? `${formatCapacity(i.wllKg, units)} (assembly ${wll} over its mode factor)` : i.markedWll ? wll : `${formatCapacity(i.wllKg, units)} (table)`}`,
        );
      if (i.hitchFactor !== undefined) figures.push(`hitch factor ${i.hitchFactor} (${i.hitch})`);
      if (i.allowedHitches && i.allowedHitches.length < 3)
        figures.push(`hitches it can make here: ${i.allowedHitches.join(", ")}`);
      break;
    case "sling-assembly":
      if (i.wllKg !== undefined) figures.push(`lowest leg WLL x hitch ${formatCapacity(i.wllKg, units)}`);
      if (i.modeFactor !== undefined)
        figures.push(`mode factor ${i.modeFactor} (${i.effectiveLegs} carrying, up to ${i.modeUpToDeg}°)`);
      if (i.publishedCapT !== undefined)
        figures.push(
          `capped at the published table value ${units === "metric" ? `${i.publishedCapT} t` : formatMarkedWll({ value: i.publishedCapT, unit: "t" }, units)}`,
        );
      if (i.ratingRule) figures.push(i.ratingRule);
      break;
    case "eyebolt":
      figures.push(`pull ${deg(i.axisAngleDeg ?? 0)} from the bolt axis`);
      if (i.column)
        figures.push(
          `DIN 580 ${i.column} column${i.scaleToMarked !== undefined ? `, scaled to the marking ${wll}` : ""}`,
        );
      if (i.percent !== undefined)
        figures.push(`${i.percent} % of ${wll || "the rated load"} (row up to ${i.tableUpToDeg}°)`);
      break;
    case "shackle":
      figures.push(
        `side load ${deg(i.sideLoadAngleDeg ?? 0)}${i.percent !== undefined ? `: ${i.percent} % of ${wll}` : ""}`,
      );
      break;
    case "shared-shackle":
      if (i.includedAngleDeg !== undefined) figures.push(`legs ${deg(i.includedAngleDeg)} apart`);
      break;
    case "master-link":
    case "crane-load":
      if (i.gross)
        figures.push(`${check.kind === "crane-load" ? "gross load" : "hook load"} = ${grossText(i.gross, units)}`);
      if (wll) figures.push(`${check.kind === "crane-load" ? "SWL" : "WLL"} ${wll}`);
      break;
    case "load-tilt":
      figures.push(...tiltRuleFigures(check));
      break;
    case "leg-angle":
      if (i.limits)
        figures.push(
          `vertical within ${i.limits.verticalDeg}°, warn over ${i.limits.warnDeg}°, fail over ${i.limits.maxDeg}°`,
        );
      break;
    default:
      if (wll) figures.push(wll);
  }
  const rules = RULE_SET_NAMES[check.ruleSet];
  const text = `${check.rule}${figures.length ? `: ${figures.join("; ")}` : ""}`
    .replace(/ deg\b/g, "°")
    .replace(/\.+$/, "");
  return `${text}. ${rules}.`;
}

/** The item's name and its register code, once: "Sling leg A (chain 8 mm) · CH-07". */
export function itemText(check: AnyCheck): string {
  if (!isStructured(check) || !check.itemCode || check.item.includes(check.itemCode)) return check.item;
  return `${check.item} · ${check.itemCode}`;
}
