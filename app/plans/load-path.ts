// Whether the rigging makes a complete load path from the load to the crane: on every used leg (or
// beam drop) an attachment at the load (an eyebolt in a tapped hole, a shackle on a lug) and a sling;
// a top fitting (a master link, or the crane hook stated as taking the legs directly); a crane or
// hoist. Submission and approval are refused until it does. Pure and shared.
import type { ComponentDefinition } from "~/loads/component-definition";
import type { Arrangement, RiggingAllocation } from "~/plans/document";

/** Each gap in the load path as a sentence naming the position; empty when the path is complete. */
export function loadPathGaps(
  snapshot: { liftPoints: ReadonlyArray<Pick<ComponentDefinition["liftPoints"][number], "label" | "thread">> },
  arrangement: Pick<Arrangement, "kind" | "liftPointLabels">,
  rigging: RiggingAllocation,
): string[] {
  const gaps: string[] = [];
  const leg = arrangement.kind === "beam" ? "Drop" : "Leg";
  for (const label of arrangement.liftPointLabels) {
    const point = snapshot.liftPoints.find((p) => p.label === label);
    const r = rigging.legs[label];
    const tapped = (point?.thread ?? "").trim() !== "";
    if (tapped && r?.eyeboltItemId === undefined)
      gaps.push(
        `${leg} ${label} has no eyebolt at the load (lift point ${label} is a tapped ${point!.thread.trim()} hole).`,
      );
    if (!tapped && r?.shackleItemId === undefined)
      gaps.push(
        `${leg} ${label} has no shackle at the load (lift point ${label} has no thread, so it is taken as a lug).`,
      );
    if (r?.slingItemId === undefined) gaps.push(`${leg} ${label} has no sling.`);
  }
  if (rigging.masterLinkItemId === undefined && !rigging.hookTakesLegs)
    gaps.push(
      arrangement.kind === "beam"
        ? "The beam has no top fitting: allocate a master link, or state that the crane hook takes the beam's top rigging directly."
        : "The legs have no top fitting: allocate a master link, or state that the crane hook takes the legs directly.",
    );
  if (rigging.craneItemId === undefined) gaps.push("No crane or hoist is allocated.");
  return gaps;
}
