import { VERDICT_LABELS } from "~/plans/check-text";
import type { Verdict } from "~/statics/check-types";

const VERDICT_CLASS: Record<Verdict, string> = {
  pass: "bg-pass-soft text-pass",
  warn: "bg-warn-soft text-warn",
  fail: "bg-fail-soft text-fail",
};

/** A check's verdict as a small tag: Pass, Warn or Fail (or "Not yet checked" before any gear is allocated). The one badge every results view uses. */
export function StatusBadge({ verdict }: { verdict: Verdict | "unchecked" }) {
  if (verdict === "unchecked")
    return (
      <span className="inline-block rounded bg-paper px-1.5 py-0.5 text-xs font-semibold text-ink-soft">
        Not yet checked: no gear allocated
      </span>
    );
  return (
    <span className={`inline-block rounded px-1.5 py-0.5 text-xs font-semibold ${VERDICT_CLASS[verdict]}`}>
      {VERDICT_LABELS[verdict]}
    </span>
  );
}
