import type { ResultState } from "~/components/live-results";
import type { SaveState } from "~/components/plan-editor/use-autosave";
import type { PlanResults } from "~/plans/document";
import { figureDifferences } from "~/plans/live-vs-saved";
import type { Units } from "~/utils/format";

/**
 * A note when the server's results for the saved plan differ from the live figures shown for the same
 * layout: the server judges the register as it stands at the save and adds its own checks. Shown only
 * while nothing waits to be saved, so the two describe the same plan.
 */
export function FiguresDiffer({
  live,
  saved,
  save,
  units,
}: {
  live: ResultState;
  saved: PlanResults | null;
  save: SaveState;
  units: Units;
}) {
  if (save.kind !== "saved" || saved === null || live.kind !== "done") return null;
  const differences = figureDifferences(live, saved, units);
  if (differences.length === 0) return null;
  return (
    <div role="status" className="rounded border border-warn/40 bg-warn-soft p-3 text-sm" data-testid="figures-differ">
      <p className="font-semibold">
        The server&apos;s figures differ{saved.computedOn ? ` (worked out ${saved.computedOn})` : ""}:
      </p>
      <ul className="list-disc pl-5">
        {differences.map((d) => (
          <li key={d}>{d}</li>
        ))}
      </ul>
      <p className="text-xs text-ink-soft">
        The saved results are the plan&apos;s record: submitting and approving use them.
      </p>
    </div>
  );
}
