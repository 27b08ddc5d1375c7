import { GEAR_KIND_INFO, type GearKind } from "~/gear/kinds";
import { addDays, addMonths } from "~/utils/dates";

/** Days ahead in which an examination counts as "due soon". */
export const DUE_SOON_DAYS = 30;

/**
 * Longest interval between thorough examinations without an examination scheme, in months
 * (LOLER 1998 reg 9(3)(a): lifting accessories at least every 6 months, other lifting equipment at
 * least every 12 months).
 */
export const EXAMINATION_INTERVAL_MONTHS = { accessory: 6, equipment: 12 } as const;

export type DueState = "overdue" | "due_soon" | "in_date" | "never_examined";

export const DUE_STATES: readonly DueState[] = ["overdue", "due_soon", "in_date", "never_examined"];

export const DUE_STATE_LABELS: Record<DueState, string> = {
  overdue: "OVERDUE",
  due_soon: `Due within ${DUE_SOON_DAYS} days`,
  in_date: "In date",
  never_examined: "Never examined",
};

/** The rules an organisation works to, as far as examination intervals go. */
export type ExaminationRules = "uk-eu" | "us";

/**
 * Longest interval between periodic examinations without a written scheme, in months, by rule set:
 * UK/EU, LOLER 1998 reg 9(3)(a) (accessories 6, other lifting equipment 12); US, ASME B30.9 / B30.26
 * periodic inspection at least yearly in normal service (shorter in severe service, which the examiner sets).
 */
export const MAX_INTERVAL_MONTHS: Record<ExaminationRules, { accessory: number; equipment: number }> = {
  "uk-eu": { accessory: 6, equipment: 12 },
  us: { accessory: 12, equipment: 12 },
};

/** The most months the rules allow between examinations of this kind of item without a written scheme. */
export function maxExaminationIntervalMonths(kind: GearKind, rules: ExaminationRules = "uk-eu"): number {
  return GEAR_KIND_INFO[kind].accessory ? MAX_INTERVAL_MONTHS[rules].accessory : MAX_INTERVAL_MONTHS[rules].equipment;
}

/** The latest next-due date the rules allow after an examination on `examinedOn` without a written scheme. */
export function latestNextDue(kind: GearKind, examinedOn: string, rules: ExaminationRules = "uk-eu"): string {
  return addMonths(examinedOn, maxExaminationIntervalMonths(kind, rules));
}

/** The interval in months LOLER allows for this kind of item without an examination scheme. */
export function examinationIntervalMonths(kind: GearKind): number {
  return GEAR_KIND_INFO[kind].accessory ? EXAMINATION_INTERVAL_MONTHS.accessory : EXAMINATION_INTERVAL_MONTHS.equipment;
}

/** The next examination date to offer after an examination on `examinedOn` (YYYY-MM-DD). */
export function defaultNextDue(kind: GearKind, examinedOn: string): string {
  return addMonths(examinedOn, examinationIntervalMonths(kind));
}

/**
 * Where an item stands against its next thorough examination: overdue once `today` is past the
 * due date; due soon from DUE_SOON_DAYS before it up to and including the day itself.
 */
export function dueState(nextDueOn: string | null | undefined, today: string): DueState {
  if (!nextDueOn) return "never_examined";
  if (nextDueOn < today) return "overdue";
  if (nextDueOn <= addDays(today, DUE_SOON_DAYS)) return "due_soon";
  return "in_date";
}
