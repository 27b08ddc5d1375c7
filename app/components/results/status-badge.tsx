import { VERDICT_LABELS } from "~/plans/check-text";
import type { Verdict } from "~/statics/check-types";

const VERDICT_CLASS: Record<Verdict, string> = {
  pass: "bg-pass-soft text-pass",
  warn: "bg-warn-soft text-warn",
  fail: "bg-fail-soft text-fail",
};

/** A check's verdict as a small tag: Pass, Warn or Fail. The one badge every results view uses. */
export function StatusBadge({ verdict }: { verdict: Verdict }) {
  return (
    <span className={`inline-block rounded px-1.5 py-0.5 text-xs font-semibold ${VERDICT_CLASS[verdict]}`}>
      {VERDICT_LABELS[verdict]}
    </span>
  );
}
