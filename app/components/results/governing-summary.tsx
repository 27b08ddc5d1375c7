import { StatusBadge } from "~/components/results/status-badge";
import { checkSentence, itemText, RULE_SET_NAMES, verdictOf, worstVerdict, type AnyCheck } from "~/plans/check-text";
import { governingCheck, marginText } from "~/plans/governing";
import type { RuleSetId } from "~/statics/reference";
import { formatUtilisation, type Units } from "~/utils/format";

/** The overall verdict, the check that governs, its margin and the fix the product computed; and the rule set. */
export function GoverningSummary({
  checks,
  units,
  ruleSet,
}: {
  checks: readonly AnyCheck[];
  units: Units;
  ruleSet?: RuleSetId;
}) {
  const governing = governingCheck(checks, units);
  const overall = worstVerdict(checks);
  return (
    <div className="rounded border border-rule bg-white px-3 py-2 text-sm" data-testid="governing">
      <p className="flex flex-wrap items-center gap-2">
        <StatusBadge verdict={overall} />
        <span className="font-semibold">
          {checks.length === 0
            ? "Nothing checked yet"
            : overall === "pass"
              ? `All ${checks.length} checks pass`
              : `${checks.filter((c) => verdictOf(c) === "fail").length} fail, ${checks.filter((c) => verdictOf(c) === "warn").length} warn of ${checks.length} checks`}
        </span>
        {ruleSet && <span className="text-ink-soft">· {RULE_SET_NAMES[ruleSet]}</span>}
      </p>
      {governing && (
        <div className="mt-1">
          <p>
            Governing: <span className="font-semibold">{itemText(governing.check)}</span>
            {governing.utilisation !== null && <> at {formatUtilisation(governing.utilisation)} of capacity</>}
            {governing.marginKg !== null && <> ({marginText(governing.marginKg, units)})</>}.
          </p>
          {governing.verdict !== "pass" && <p className="text-ink-soft">{checkSentence(governing.check, units)}</p>}
          {governing.fix && governing.verdict !== "pass" && (
            <p>
              <span className="font-semibold">To put it right:</span> {governing.fix}.
            </p>
          )}
        </div>
      )}
    </div>
  );
}
