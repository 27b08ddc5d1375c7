// What hangs above the sling: the master link and the crane (gross load with every item's own
// mass), the hook's headroom, and each allocated item's thorough examination.
import type { Check, CraneSpec, GrossLoad, InspectionRecord, MasterLinkSpec } from "./check-types";
import { failCheck, isoDateToDay, markedWll, ratioCheck, statedWllKg, type CheckBase } from "./checks-common";
import { DEFAULT_RULE_SET, type ReferenceTables, type RuleSetId } from "./reference";
import { ruleSetRow } from "./rule-sets";

/** Examination due within this many days gives a warning. */
export const EXAMINATION_WARN_DAYS = 30;

export interface HookOptions {
  ruleSet?: RuleSetId;
  /** What the load is made of (load, contingency, items' masses, beam), for the rule's words. */
  gross?: GrossLoad;
}

function grossInputs(gross: GrossLoad | undefined) {
  return gross ? { gross } : {};
}

/** Items in the load path whose own mass is unknown make the gross load incomplete: a warning. */
function warnIfUnrecorded(check: Check, gross: GrossLoad | undefined): Check {
  if (!gross || gross.unrecorded.length === 0 || check.verdict !== "pass") return check;
  return {
    ...check,
    verdict: "warn",
    finding: "masses-unrecorded",
    fix: { kind: "record-masses", items: gross.unrecorded },
  };
}

/** Master link or top fitting: the total hook load (kg) against its WLL. */
export function checkMasterLink(hookLoadKg: number, spec: MasterLinkSpec, options: HookOptions = {}): Check {
  const wllKg = statedWllKg(spec);
  const base: CheckBase = {
    id: "master-link",
    kind: "master-link",
    item: "Master link",
    itemCode: spec.itemCode ?? null,
    position: { legs: [] },
    rule: "Hook load (load with contingency, the rigging below it) against the WLL",
    ruleSet: options.ruleSet ?? DEFAULT_RULE_SET,
    source: "marked WLL",
    inputs: { ...markedWll(spec), ...grossInputs(options.gross), ...(wllKg !== null ? { wllKg } : {}) },
  };
  if (wllKg === null) return failCheck(base, "no-wll", { kind: "state-wll" }, hookLoadKg, null);
  return warnIfUnrecorded(
    ratioCheck(base, hookLoadKg, wllKg, { kind: "larger-item", minWllKg: hookLoadKg }),
    options.gross,
  );
}

/** Crane or hoist: gross load (kg) = load x (1 + contingency) + every allocated item's mass + beam, against SWL. */
export function checkCraneLoad(grossLoadKg: number, crane: CraneSpec, options: HookOptions = {}): Check {
  const check = ratioCheck(
    {
      id: "crane-load",
      kind: "crane-load",
      item: "Crane or hoist",
      itemCode: crane.itemCode ?? null,
      position: { legs: [] },
      rule: "Gross load = load x (1 + contingency) + every allocated item's own mass + beam, against the SWL",
      ruleSet: options.ruleSet ?? DEFAULT_RULE_SET,
      source: "LOLER reg 8; ASME P30.1 ch. 5 (gross load including rigging)",
      inputs: { wllKg: crane.swlKg, ...(crane.swl ? { markedWll: crane.swl } : {}), ...grossInputs(options.gross) },
    },
    grossLoadKg,
    crane.swlKg,
    { kind: "larger-item", minWllKg: grossLoadKg },
  );
  return warnIfUnrecorded(check, options.gross);
}

/** Hook headroom: hook height needed over the floor (m) against the hook's highest position (m). */
export function checkHeadroom(
  neededHookHeightM: number,
  maxHookHeightM: number,
  options: { ruleSet?: RuleSetId; itemCode?: string } = {},
): Check {
  const utilisation = maxHookHeightM > 0 ? neededHookHeightM / maxHookHeightM : Infinity;
  const ok = neededHookHeightM <= maxHookHeightM + 1e-9;
  return {
    id: "crane-headroom",
    kind: "crane-headroom",
    item: "Crane hook headroom",
    itemCode: options.itemCode ?? null,
    position: { legs: [] },
    verdict: ok ? "pass" : "fail",
    finding: ok ? "within" : "headroom-short",
    loadKg: null,
    capacityKg: null,
    utilisation,
    rule: "Hook height needed over the floor within the hook's highest position",
    ruleSet: options.ruleSet ?? DEFAULT_RULE_SET,
    source: "LOLER reg 8; BS 7121 (planning the lift path)",
    inputs: { neededHookHeightM, maxHookHeightM },
    fix: ok ? null : { kind: "more-headroom", shortfallM: neededHookHeightM - maxHookHeightM },
  };
}

export interface InspectionOptions {
  ruleSet?: RuleSetId;
  tables?: ReferenceTables;
  /** The planned lift date, YYYY-MM-DD: the item must be in date then as well as today. */
  liftDateIso?: string | null;
}

/**
 * Inspection status of an allocated item: in service, and in date for thorough examination today
 * and on the planned lift date (YYYY-MM-DD); due within 30 days of today warns.
 */
export function checkInspection(
  itemName: string,
  record: InspectionRecord,
  todayIso: string,
  options: InspectionOptions = {},
): Check {
  const ruleSet = options.ruleSet ?? DEFAULT_RULE_SET;
  const source = options.tables
    ? ruleSetRow(options.tables, ruleSet).examinationSource
    : "UK LOLER 1998 reg 9(3); ASME B30.9 / B30.26 periodic inspection";
  const due = isoDateToDay(record.examinationDue);
  const today = isoDateToDay(todayIso);
  const liftDateIso = options.liftDateIso ?? null;
  const lift = liftDateIso ? isoDateToDay(liftDateIso) : null;
  const base = {
    id: `inspection-${record.itemId}`,
    kind: "inspection" as const,
    item: `${itemName} (${record.itemId})`,
    itemCode: record.itemId,
    position: { legs: [] as string[] },
    loadKg: null,
    capacityKg: null,
    utilisation: null,
    rule: "In service, and in date for thorough examination today and on the planned lift date",
    ruleSet,
    source,
    inputs: {
      inspection: {
        status: record.status,
        examinationDue: due === null ? null : record.examinationDue,
        todayIso,
        liftDateIso: lift === null ? null : liftDateIso,
        daysLeftToday: due !== null && today !== null ? due - today : null,
        daysLeftAtLift: due !== null && lift !== null ? due - lift : null,
        warnDays: EXAMINATION_WARN_DAYS,
      },
    },
  };
  if (record.status !== "in_service") {
    return {
      ...base,
      verdict: "fail",
      finding: record.status === "quarantined" ? "quarantined" : "withdrawn",
      fix: { kind: "replace-item" },
    };
  }
  if (due === null || today === null)
    return { ...base, verdict: "fail", finding: "no-due-date", fix: { kind: "record-examination" } };
  if (due < today)
    return { ...base, verdict: "fail", finding: "overdue", fix: { kind: "examine-before", dateIso: todayIso } };
  if (lift !== null && due < lift) {
    return {
      ...base,
      verdict: "fail",
      finding: "overdue-at-lift",
      fix: { kind: "examine-before", dateIso: liftDateIso! },
    };
  }
  if (due - today <= EXAMINATION_WARN_DAYS) {
    return {
      ...base,
      verdict: "warn",
      finding: "due-soon",
      fix: { kind: "examine-before", dateIso: record.examinationDue },
    };
  }
  return { ...base, verdict: "pass", finding: "in-date", fix: null };
}

/** An item with no thorough examination on record: it fails until one is recorded. */
export function checkNeverExamined(
  itemName: string,
  itemCode: string,
  todayIso: string,
  options: InspectionOptions = {},
): Check {
  const ruleSet = options.ruleSet ?? DEFAULT_RULE_SET;
  return {
    id: `inspection-${itemCode}`,
    kind: "inspection",
    item: `${itemName} (${itemCode})`,
    itemCode,
    position: { legs: [] },
    verdict: "fail",
    finding: "no-due-date",
    loadKg: null,
    capacityKg: null,
    utilisation: null,
    rule: "In service, and in date for thorough examination today and on the planned lift date",
    ruleSet,
    source: options.tables ? ruleSetRow(options.tables, ruleSet).examinationSource : "UK LOLER 1998 reg 9(3)",
    inputs: {
      inspection: {
        status: "in_service",
        examinationDue: null,
        todayIso,
        liftDateIso: options.liftDateIso ?? null,
        daysLeftToday: null,
        daysLeftAtLift: null,
        warnDays: EXAMINATION_WARN_DAYS,
      },
    },
    fix: { kind: "record-examination" },
  };
}
