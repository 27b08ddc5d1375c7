// How figures and dates read on the printed plan: loads and utilisations only ever rounded up.
import { PLAN_STATUS_LABELS } from "~/plans/document";
import type { PrintablePlan } from "~/plans/printable";
import type { CheckResult } from "~/statics/checks";
import { ceilTo } from "~/statics/units";
import { formatMass, toDisplayMass, type Units } from "~/utils/format";

/** "2025-05-12 08:40 UTC" from an ISO timestamp. */
export function utcText(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  const s = d.toISOString();
  return `${s.slice(0, 10)} ${s.slice(11, 16)} UTC`;
}

/** A utilisation as a whole percent, never rounded down. */
export function percentUp(u: number | null): string {
  if (u === null) return "–";
  if (!Number.isFinite(u)) return "no rating";
  return `${ceilTo(u * 100, 0).toLocaleString("en-GB")} %`;
}

/** A load, rounded up so the print never understates it. */
export function loadText(kg: number, units: Units): string {
  return formatMass(Math.ceil(kg - 1e-9), units);
}
export const knText = (kn: number) => `${ceilTo(kn, 2).toFixed(2)} kN`;
export const degText = (d: number) => `${d.toFixed(1)}°`;
/** The mass figure of a tension in the user's unit, without the unit, rounded up ("1,650"). */
export const tensionMassNumber = (kg: number, units: Units) =>
  Math.ceil(toDisplayMass(kg, units) - 1e-9).toLocaleString("en-GB");

export const VERDICT: Record<CheckResult["status"], string> = { pass: "PASS", warn: "WARN", fail: "FAIL" };

export function statusWords(status: PrintablePlan["status"]): string {
  if (status === "superseded" || status === "cancelled") return `${PLAN_STATUS_LABELS[status]}: not for use`;
  return PLAN_STATUS_LABELS[status];
}
