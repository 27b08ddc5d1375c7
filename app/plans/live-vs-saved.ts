// What the editor's live figures and the server's saved results for the same plan disagree on, in words.
// Both come from the same core; they part when the server knows more (the register as it stands now, an
// allocation it refuses, checks it adds) or its day has moved on. A difference counts only where it shows:
// figures are compared as the pages print them (rounded up), so rounding alone never makes one.
import { itemText, verdictOf, VERDICT_LABELS, type AnyCheck } from "~/plans/check-text";
import { governingCheck } from "~/plans/governing";
import { formatForce, formatUtilisation, type Units } from "~/utils/format";

export type SolvedFigures = { status: number; body: unknown };

type Body = {
  error?: string;
  legs?: Array<{ liftPointId: string; tensionKn: number }>;
  checks?: AnyCheck[];
};

const checkText = (c: AnyCheck) =>
  `${itemText(c)} ${VERDICT_LABELS[verdictOf(c)].toLowerCase()} at ${formatUtilisation(c.utilisation)}`;

/** The differences a reader would see between the live figures and the saved ones; empty when they agree. */
export function figureDifferences(live: SolvedFigures, saved: SolvedFigures, units: Units): string[] {
  const l = (live.body ?? {}) as Body;
  const s = (saved.body ?? {}) as Body;
  if (saved.status !== 200 || live.status !== 200) {
    if (saved.status === live.status && (l.error ?? "") === (s.error ?? "")) return [];
    if (saved.status !== 200) return [`the server could not work the plan out: ${s.error ?? `status ${saved.status}`}`];
    return ["the server worked out figures where the editor could not"];
  }
  const out: string[] = [];
  const lc = l.checks ?? [];
  const sc = s.checks ?? [];
  const lg = governingCheck(lc, units);
  const sg = governingCheck(sc, units);
  if (sg && (!lg || checkText(lg.check) !== checkText(sg.check)))
    out.push(`governing check ${checkText(sg.check)}${lg ? ` (here: ${checkText(lg.check)})` : ""}`);
  const liveLegs = new Map((l.legs ?? []).map((leg) => [leg.liftPointId, leg.tensionKn]));
  for (const leg of s.legs ?? []) {
    const here = liveLegs.get(leg.liftPointId);
    const theirs = formatForce(leg.tensionKn, units);
    if (here === undefined) out.push(`leg ${leg.liftPointId} carries ${theirs} (not solved here)`);
    else if (formatForce(here, units) !== theirs)
      out.push(`leg ${leg.liftPointId} carries ${theirs} (here: ${formatForce(here, units)})`);
  }
  const liveById = new Map(lc.map((c) => [c.id, c]));
  const savedIds = new Set(sc.map((c) => c.id));
  const more = sc.filter((c) => {
    const here = liveById.get(c.id);
    return !here || verdictOf(here) !== verdictOf(c);
  });
  if (more.length > 0) out.push(`the server's checks say ${more.map(checkText).join("; ")}`);
  const fewer = lc.filter((c) => !savedIds.has(c.id));
  if (fewer.length > 0) out.push(`the server does not list ${fewer.map((c) => itemText(c)).join("; ")}`);
  return out;
}
