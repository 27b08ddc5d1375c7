// Small helpers shared by the checks: verdicts from ratios, stated WLLs, dates.
import type { Check, CheckInputs, CheckKind, Finding, Fix, Wll } from "./check-types";
import type { RuleSetId } from "./reference";
import { massToKg } from "./units";

export const EPS = 1e-12;

export interface CheckBase {
  id: string;
  kind: CheckKind;
  item: string;
  itemCode: string | null;
  position: { legs: string[] };
  rule: string;
  ruleSet: RuleSetId;
  source: string;
  inputs: CheckInputs;
}

/**
 * A load-against-capacity check (kg): over capacity fails with the fix, else passes. A capacity of
 * zero gives an infinite utilisation. Utilisation is never rounded here.
 */
export function ratioCheck(base: CheckBase, loadKg: number, capacityKg: number, fixWhenOver: Fix | null): Check {
  const utilisation = capacityKg > 0 ? loadKg / capacityKg : Infinity;
  const over = utilisation > 1 + EPS;
  return {
    ...base,
    verdict: over ? "fail" : "pass",
    finding: over ? "over" : "within",
    loadKg,
    capacityKg,
    utilisation,
    fix: over ? fixWhenOver : null,
  };
}

/** A check that fails without a load ratio (or with one, where the capacity is known). */
export function failCheck(
  base: CheckBase,
  finding: Finding,
  fix: Fix | null,
  loadKg: number | null = null,
  capacityKg: number | null = null,
): Check {
  const utilisation = loadKg !== null && capacityKg !== null ? loadKg / Math.max(capacityKg, EPS) : null;
  return { ...base, verdict: "fail", finding, loadKg, capacityKg, utilisation, fix };
}

/** A stated WLL in kg: wllKg, or wll {value, unit}; null when neither is given. */
export function statedWllKg(spec: { wllKg?: number; wll?: Wll }): number | null {
  if (spec.wllKg !== undefined) return spec.wllKg;
  if (spec.wll !== undefined) return massToKg(spec.wll.value, spec.wll.unit);
  return null;
}

/** The WLL as marked, where the spec gives it with its unit. */
export function markedWll(spec: { wll?: Wll }): { markedWll?: Wll } {
  return spec.wll ? { markedWll: { value: spec.wll.value, unit: spec.wll.unit } } : {};
}

/** Fraction applied to the load for contingency: 1 + pct/100. */
export function contingencyFactor(contingencyPct: number | undefined): number {
  return 1 + (contingencyPct ?? 0) / 100;
}

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Days since 1970-01-01 for a YYYY-MM-DD date, or null when invalid. */
export function isoDateToDay(iso: string): number | null {
  const m = ISO_DATE.exec(iso);
  if (!m) return null;
  const y = Number(m[1]);
  const mo = Number(m[2]);
  const d = Number(m[3]);
  const t = Date.UTC(y, mo - 1, d);
  const back = new Date(t);
  if (back.getUTCFullYear() !== y || back.getUTCMonth() !== mo - 1 || back.getUTCDate() !== d) return null;
  return Math.round(t / 86_400_000);
}
