// A revision's drawing, shown and never edited: the editor's two views of the load (elevation x-z and
// plan x-y) to scale, with the legs, hook and each leg's figures from the results given. The canvas is
// browser only (Konva), so the server renders the frames and the figures as text; the drawing fills in
// after hydration.
import { lazy, Suspense } from "react";
import type { LegFigure } from "~/components/plan-canvas.client";
import { useElementWidth, viewsLayout } from "~/components/plan-editor/fields";
import { tensionText } from "~/components/results/leg-table";
import type { ComponentDefinition } from "~/loads/component-definition";
import { standing } from "~/plans/check-text";
import type { Arrangement, PlanResults, RiggingAllocation } from "~/plans/document";
import { gridStepM, type PlanEdit } from "~/plans/editor-state";
import { formatAngle, type Units } from "~/utils/format";

const PlanCanvas = lazy(() => import("~/components/plan-canvas.client"));

const ignore = () => undefined;

export function PlanDrawing({
  snapshot,
  arrangement,
  rigging,
  results,
  units,
}: {
  snapshot: ComponentDefinition;
  arrangement: Arrangement;
  rigging: RiggingAllocation;
  results: PlanResults;
  units: Units;
}) {
  const [ref, width] = useElementWidth<HTMLDivElement>();
  const edit: PlanEdit = {
    cog: snapshot.cog,
    liftPoints: snapshot.liftPoints.map((p) => ({
      label: p.label,
      position: p.position,
      axis: p.axis,
      thread: p.thread,
    })),
    arrangement,
    rigging,
    // Read only: the snapshot's CoG already is the CoG as planned.
    override: null,
  };
  const body = results.status === 200 ? results.body : null;
  const hook = body?.hook ?? (arrangement.mode === "level" ? { ...snapshot.cog, z: arrangement.hookHeightM } : null);
  const checks = body?.checks ?? [];
  const legs: LegFigure[] = (body?.legs ?? []).map((leg) => {
    const s = standing(checks, leg.liftPointId);
    return {
      label: leg.liftPointId,
      text: `${leg.liftPointId}: ${tensionText(leg.tensionKn, leg.tensionKg, units)} · ${formatAngle(leg.angleFromVerticalDeg)}`,
      tone: s === "unchecked" ? "none" : s,
      slack: leg.slack,
    };
  });
  // A beam is drawn where the results placed it (from its register lugs, or the typed beam of an older plan).
  const placement = body?.beam?.placement ?? null;
  const beam =
    arrangement.kind === "beam"
      ? { placement, problem: placement ? null : "The beam's position is not in these results." }
      : null;
  const views = viewsLayout(width);
  const viewWidth = views.viewWidth;
  const viewHeight = Math.max(240, Math.min(420, Math.round(viewWidth * 0.7)));
  return (
    <div className="space-y-2" data-testid="plan-drawing">
      <div ref={ref} className="grid gap-4" style={views.style}>
        {(["elevation", "plan"] as const).map((view) => (
          <figure key={view} className="overflow-hidden rounded border border-rule bg-white">
            <figcaption className="border-b border-rule px-3 py-1 text-sm font-semibold">
              {view === "elevation" ? "Elevation (x, z)" : "Plan (x, y)"}
            </figcaption>
            {viewWidth > 0 ? (
              <Suspense fallback={<p className="p-4 text-sm text-ink-soft">Loading the drawing…</p>}>
                <PlanCanvas
                  view={view}
                  width={viewWidth - 2}
                  height={viewHeight}
                  edit={edit}
                  outline={view === "elevation" ? snapshot.outlineElevation : snapshot.outlinePlan}
                  hook={hook}
                  legs={legs}
                  units={units}
                  gridM={gridStepM(units)}
                  snap={false}
                  dispatch={ignore}
                  beam={beam}
                  readOnly
                  selected={null}
                  onSelect={ignore}
                  onToggleSnap={ignore}
                  label={`${view === "elevation" ? "Elevation" : "Plan"} drawing of the revision, to scale (read only)`}
                />
              </Suspense>
            ) : (
              <div style={{ height: viewHeight }} />
            )}
          </figure>
        ))}
      </div>
      {legs.length > 0 && (
        <ul className="text-xs text-ink-soft" aria-label="Leg figures on the drawing">
          {legs.map((l) => (
            <li key={l.label}>
              {l.text}
              {l.slack ? " (slack)" : ""}
            </li>
          ))}
        </ul>
      )}
      <p className="text-xs text-ink-soft">
        Drawn to scale from the revision as it stands; wheel to zoom and drag to pan. Leg colours follow the worst check
        on each leg (green pass, amber warn, red fail, grey unchecked); a dashed leg is slack.
      </p>
    </div>
  );
}
