// The check that governs a plan, and its margin in words. Pure and shared with the browser.
import type { Verdict } from "~/statics/check-types";
import { fixText, isStructured, RANK, verdictOf, type AnyCheck } from "~/plans/check-text";
import { formatCapacity, formatLoad, type Units } from "~/utils/format";

export type Governing = {
  check: AnyCheck;
  verdict: Verdict;
  utilisation: number | null;
  /** Capacity left (negative: over by), kg; null where the check is not a load ratio. */
  marginKg: number | null;
  fix: string | null;
};

/** The check that governs: the worst verdict, then the highest utilisation. Null when there are none. */
export function governingCheck(checks: readonly AnyCheck[], units: Units): Governing | null {
  let best: AnyCheck | null = null;
  const score = (c: AnyCheck) => [RANK[verdictOf(c)], c.utilisation ?? -1] as const;
  for (const c of checks) {
    if (!best) {
      best = c;
      continue;
    }
    const [v, u] = score(c);
    const [bv, bu] = score(best);
    if (v > bv || (v === bv && u > bu)) best = c;
  }
  if (!best) return null;
  const marginKg = best.loadKg !== null && best.capacityKg !== null ? best.capacityKg - best.loadKg : null;
  const fix = isStructured(best) && best.fix ? fixText(best.fix, units, best) : null;
  return { check: best, verdict: verdictOf(best), utilisation: best.utilisation, marginKg, fix };
}

/** The margin in words: "1,234 kg to spare" (rounded down) or "over by 56 kg" (rounded up). */
export function marginText(marginKg: number, units: Units): string {
  return marginKg >= 0 ? `${formatCapacity(marginKg, units)} to spare` : `over by ${formatLoad(-marginKg, units)}`;
}
