// Work made on a phone without signal is judged at the time it was made: a problem with the gear that began
// after that moment did not stand in the rigger's way, but it is news for the rigger and the planner. Pure.
import type { LiveGearState, LiveProblem } from "~/plans/live-state";

/** When a problem began as a time; null when unknown (then it is taken to have stood all along). */
function sinceTime(since: string | null): number | null {
  if (!since) return null;
  const t = new Date(/^\d{4}-\d{2}-\d{2}$/.test(since) ? `${since}T00:00:00Z` : since).getTime();
  return Number.isNaN(t) ? null : t;
}

/**
 * The live state split at `madeAt`: `asMade` holds the problems that already stood (or whose start is not known),
 * `arisenSince` those that began after the work was made. An overdue examination is judged on the lift date, so
 * it always stood.
 */
export function judgedAsMade(
  state: LiveGearState,
  madeAt: Date,
): { asMade: LiveGearState; arisenSince: LiveProblem[] } {
  const made = madeAt.getTime();
  const arisenSince = state.problems.filter((p) => {
    if (p.kind === "overdue" || p.kind === "missing") return false;
    const t = sinceTime(p.since);
    return t !== null && t > made;
  });
  const problems = state.problems.filter((p) => !arisenSince.includes(p));
  return { asMade: { ...state, fit: problems.length === 0, problems }, arisenSince };
}
