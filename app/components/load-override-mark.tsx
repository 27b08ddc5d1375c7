// The mark shown wherever the load's figures appear when the plan's mass or CoG differs from the
// component's: both figures and the planner's reason.
import { overrideSentences, type LoadOverrideMark } from "~/plans/load-override";
import type { Units } from "~/utils/format";

export function LoadOverrideNotice({ mark, units }: { mark: LoadOverrideMark | null | undefined; units: Units }) {
  if (!mark) return null;
  return (
    <div
      role="note"
      data-testid="load-override"
      className="mt-3 rounded border border-warn/40 bg-warn-soft px-3 py-2 text-sm"
    >
      <p className="font-semibold">Differs from the component: the planner overrode the {overriddenWhat(mark)}</p>
      <ul className="mt-1 list-disc pl-5">
        {overrideSentences(mark, units).map((line) => (
          <li key={line}>{line}</li>
        ))}
      </ul>
    </div>
  );
}

function overriddenWhat(mark: LoadOverrideMark) {
  return mark.mass && mark.cog ? "mass and CoG." : mark.mass ? "mass." : "CoG.";
}
