import { memo } from "react";
import { StatusBadge } from "~/components/results/status-badge";
import { checkSentence, itemText, ruleText, verdictOf, type AnyCheck } from "~/plans/check-text";
import { formatUtilisation, type Units } from "~/utils/format";

const RANK = { fail: 0, warn: 1, pass: 2 } as const;

/**
 * Every check with its verdict, item, utilisation (once, never rounded down), the finding in the
 * user's units with the fix, and the rule and source it came from. Worst first.
 */
export function ChecksList({
  checks,
  units,
  empty = "No checks yet: allocate gear to check each item against its WLL.",
}: {
  checks: readonly AnyCheck[];
  units: Units;
  empty?: string;
}) {
  if (checks.length === 0) return <p className="text-sm text-ink-soft">{empty}</p>;
  const sorted = [...checks].sort((a, b) => RANK[verdictOf(a)] - RANK[verdictOf(b)]);
  return (
    <ul className="space-y-2 text-sm" data-testid="checks">
      {sorted.map((c) => (
        <CheckRow key={c.id} check={c} units={units} />
      ))}
    </ul>
  );
}

function CheckRowShown({ check: c, units }: { check: AnyCheck; units: Units }) {
  return (
    <li className="flex gap-2" data-check={c.id}>
      <span className="shrink-0">
        <StatusBadge verdict={verdictOf(c)} />
      </span>
      <span className="min-w-0">
        <span className="font-semibold">{itemText(c)}</span>
        {c.utilisation !== null && (
          <span className="ml-1 whitespace-nowrap">· {formatUtilisation(c.utilisation)} of capacity</span>
        )}
        <span className="block">{checkSentence(c, units)}</span>
        <span className="block text-xs text-ink-soft">
          {ruleText(c, units)} Source: {c.source}
        </span>
      </span>
    </li>
  );
}

/** A check as text, every number exactly (NaN, the infinities and -0 kept apart from null and 0). */
const checkKey = (check: AnyCheck) =>
  JSON.stringify(check, (_key, value: unknown) =>
    typeof value === "number" && (!Number.isFinite(value) || Object.is(value, -0))
      ? `number:${String(value)}${Object.is(value, -0) ? "-0" : ""}`
      : value,
  );

/**
 * A check's row, drawn again only when the check says something else: each solve builds new check objects, and
 * on a move most (the examinations, the crane's) come out the same. Checks are plain data, so the same text is
 * the same check.
 */
const CheckRow = memo(
  CheckRowShown,
  (a, b) => a.units === b.units && (a.check === b.check || checkKey(a.check) === checkKey(b.check)),
);
