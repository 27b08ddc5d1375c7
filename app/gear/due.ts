import { GEAR_KIND_INFO, type GearKind } from "~/gear/kinds";

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

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Whether `value` is a real calendar date written YYYY-MM-DD. */
export function isIsoDate(value: string): boolean {
  const m = ISO_DATE.exec(value);
  if (!m) return false;
  const d = new Date(Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])));
  return d.toISOString().slice(0, 10) === value;
}

function parseIso(value: string): Date {
  if (!isIsoDate(value)) throw new Error(`Not a date: ${value}`);
  return new Date(`${value}T00:00:00Z`);
}

function formatIso(date: Date): string {
  return date.toISOString().slice(0, 10);
}

/** Today's date (the server's local calendar day) as YYYY-MM-DD. */
export function todayIso(now = new Date()): string {
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}

/** `date` plus whole days (negative to go back). */
export function addDays(date: string, days: number): string {
  const d = parseIso(date);
  d.setUTCDate(d.getUTCDate() + days);
  return formatIso(d);
}

/** `date` plus whole calendar months; the 31st lands on the last day of a shorter month (31 Aug + 6 = 28/29 Feb). */
export function addMonths(date: string, months: number): string {
  const d = parseIso(date);
  const day = d.getUTCDate();
  const target = new Date(Date.UTC(d.getUTCFullYear(), d.getUTCMonth() + months, 1));
  const lastDay = new Date(Date.UTC(target.getUTCFullYear(), target.getUTCMonth() + 1, 0)).getUTCDate();
  target.setUTCDate(Math.min(day, lastDay));
  return formatIso(target);
}

/** The interval in months the rule set (default LOLER) allows for this kind of item without an examination scheme. */
export function examinationIntervalMonths(
  kind: GearKind,
  intervals: ExaminationIntervals = EXAMINATION_INTERVAL_MONTHS,
): number {
  return GEAR_KIND_INFO[kind].accessory ? intervals.accessory : intervals.equipment;
}

/** The next examination date to offer after an examination on `examinedOn` (YYYY-MM-DD). */
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

/** Whole days from `today` until `date` (negative when past). */
export function daysUntil(date: string, today: string): number {
  return Math.round((parseIso(date).getTime() - parseIso(today).getTime()) / 86_400_000);
}
