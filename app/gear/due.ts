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

/** The longest intervals a rule set allows without an examination scheme, months, and where they come from. */
export type ExaminationIntervals = { accessory: number; equipment: number; source?: string };

/** A rule set's examination intervals. */
export function intervalsOf(ruleSet: {
  accessoryExaminationMonths: number;
  equipmentExaminationMonths: number;
  examinationSource: string;
}): ExaminationIntervals {
  return {
    accessory: ruleSet.accessoryExaminationMonths,
    equipment: ruleSet.equipmentExaminationMonths,
    source: ruleSet.examinationSource,
  };
}

export type DueState = "overdue" | "due_soon" | "in_date" | "never_examined";

export const DUE_STATES: readonly DueState[] = ["overdue", "due_soon", "in_date", "never_examined"];

export const DUE_STATE_LABELS: Record<DueState, string> = {
  overdue: "OVERDUE",
  due_soon: `Due within ${DUE_SOON_DAYS} days`,
  in_date: "In date",
  never_examined: "Never examined",
};

/** The interval in months the rule set (default LOLER) allows for this kind of item without an examination scheme. */
export function examinationIntervalMonths(
  kind: GearKind,
  intervals: ExaminationIntervals = EXAMINATION_INTERVAL_MONTHS,
): number {
  return GEAR_KIND_INFO[kind].accessory ? intervals.accessory : intervals.equipment;
}

/**
 * The next examination date to offer after an examination on `examinedOn` (YYYY-MM-DD): the rule set's
 * longest interval, which is also the latest due date allowed without a written examination scheme.
 */
export function defaultNextDue(
  kind: GearKind,
  examinedOn: string,
  intervals: ExaminationIntervals = EXAMINATION_INTERVAL_MONTHS,
): string {
  return addMonths(examinedOn, examinationIntervalMonths(kind, intervals));
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
