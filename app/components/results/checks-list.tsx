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
        <li key={c.id} className="flex gap-2" data-check={c.id}>
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
      ))}
    </ul>
  );
}
