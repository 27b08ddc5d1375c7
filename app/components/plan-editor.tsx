// The plan editor: two linked views of the load drawn to scale (Konva, browser only), a
// properties panel for exact values, live results worked out in the browser by the statics core,
// gear allocation, the hook-height chart and autosave through PUT /api/plans/:planId.
import { lazy, memo, Suspense, useCallback, useEffect, useId, useMemo, useReducer, useState } from "react";
import type { ComponentDefinition } from "~/loads/component-definition";
import type { LegFigure } from "~/components/plan-canvas.client";
import { Button } from "~/components/ui/form";
import { HookHeightChart } from "~/components/hook-height-chart";
import { LiveResults, type ResultState } from "~/components/live-results";
import { tensionText } from "~/components/results/leg-table";
import { ArrangementPanel } from "~/components/plan-editor/arrangement-panel";
import { toEdit, useElementWidth, viewsLayout } from "~/components/plan-editor/fields";
import { GearTable } from "~/components/plan-editor/gear-table";
import { HandleRadios } from "~/components/plan-editor/handle-radios";
import { LoadOverridePanel } from "~/components/plan-editor/load-override-panel";
import { FiguresDiffer } from "~/components/plan-editor/figures-differ";
import { TracingPanel, useTracing } from "~/components/plan-editor/tracing";
import { useAutosave } from "~/components/plan-editor/use-autosave";
import { useSettledValue } from "~/components/plan-editor/use-settled-value";
import { useLiveSolve, type LiveSolution } from "~/components/plan-editor/use-live-solve";
import { editorArrangementInput } from "~/plans/editor-input";
import { toSolveBody } from "~/statics/api";
import { standing } from "~/plans/check-text";
import { LEVELLING_STEP_M } from "~/plans/check-text-tilt";

/** Grey until the leg's gear is checked; a failing or warning angle shows at once. */
const legTone = (s: ReturnType<typeof standing>): LegFigure["tone"] => (s === "unchecked" ? "none" : s);
import type { PlanDetails, PlanResults, RiggingAllocation, Arrangement } from "~/plans/document";
import {
  canRedo,
  canUndo,
  editorReducer,
  gridStepM,
  handleKey,
  handleName,
  initialEditorState,
  movableHandles,
  type EditorAction,
  type Handle,
} from "~/plans/editor-state";
import type { LoadOverride } from "~/plans/load-override";
import type { GearPick } from "~/plans/rigging";
import { editorBeamPlacement } from "~/plans/beam-geometry";
import type { ReferenceTables, RuleSetId } from "~/statics/reference";
import { formatLength, type Units } from "~/utils/format";

// The drawings, the results and the gear table are drawn again only when their props change: a move
// changes the figures, but a render for something else (a save's status, the chart catching up) leaves them.
const PlanCanvas = lazy(() => import("~/components/plan-canvas.client").then((m) => ({ default: memo(m.default) })));
const MemoLiveResults = memo(LiveResults);
const MemoFiguresDiffer = memo(FiguresDiffer);
const MemoGearTable = memo(GearTable);
// The override reads the edit's override and CoG only, so a move of a lift point leaves it as it is.
const MemoLoadOverridePanel = memo(
  LoadOverridePanel,
  (a, b) =>
    a.edit.override === b.edit.override &&
    a.edit.cog === b.edit.cog &&
    a.dispatch === b.dispatch &&
    a.canEdit === b.canEdit &&
    a.units === b.units &&
    a.component === b.component,
);
// The tracing's actions are built from its state, so the same state draws the same panel.
const MemoTracingPanel = memo(
  TracingPanel,
  (a, b) =>
    a.files === b.files &&
    a.units === b.units &&
    a.tracing.backdrop === b.tracing.backdrop &&
    a.tracing.calibration === b.tracing.calibration &&
    a.tracing.calibrationDistance === b.tracing.calibrationDistance,
);
const noDispatch = () => undefined;
/** How long the layout must rest before the hook-height chart sweeps it again, ms. */
const CHART_SETTLE_MS = 150;
/** The hook-height chart sweeps the layout: drawn again only when its inputs change. */
const MemoHookHeightChart = memo(HookHeightChart);

export type EditorPlan = {
  id: number;
  title: string;
  status: string;
  version: number;
  /** The load as planned when the editor opened. */
  snapshot: ComponentDefinition;
  /** The component's own mass and CoG (the plan's copy), which the plan lifts unless overridden. */
  componentLoad: { massKg: number; cog: ComponentDefinition["cog"] };
  loadOverride: LoadOverride | null;
  arrangement: Arrangement;
  rigging: RiggingAllocation;
  details: PlanDetails;
  results: PlanResults | null;
};

export type EditorFile = { fileId: number; name: string; caption: string };

export function PlanEditor({
  plan,
  units,
  initialPicks,
  files,
  canEdit,
  ruleSet,
  todayIso,
  tables,
}: {
  plan: EditorPlan;
  units: Units;
  initialPicks: GearPick[];
  files: EditorFile[];
  canEdit: boolean;
  ruleSet: RuleSetId;
  /** The organisation's calendar day, YYYY-MM-DD: the live checks judge examinations against it, as saving does. */
  todayIso: string;
  /** The reference tables: the live figures, the hook-height chart and the gear picker run the core with them. */
  tables: ReferenceTables;
}) {
  const [state, dispatch] = useReducer(editorReducer, plan, (p) => initialEditorState(toEdit(p)));
  const edit = state.present;
  const [snap, setSnap] = useState(true);
  const [selectedKey, setSelectedKey] = useState<string | null>(null);
  const helpId = useId();
  const [picks, setPicks] = useState(() => new Map(initialPicks.map((p) => [p.id, p])));
  const [savedResults, setSavedResults] = useState<PlanResults | null>(plan.results);
  const tracing = useTracing(plan.snapshot, units);
  const [viewsRef, viewsWidth] = useElementWidth<HTMLDivElement>();
  const gridM = gridStepM(units);

  const addPick = useCallback((pick: GearPick) => setPicks((m) => new Map(m).set(pick.id, pick)), []);

  // The load as planned now: the component's mass unless the override (in the editor's state) gives another.
  const component = useMemo(() => ({ ...plan.snapshot, ...plan.componentLoad }), [plan.snapshot, plan.componentLoad]);
  const planned = useMemo(
    () => ({ ...plan.snapshot, massKg: edit.override?.massKg ?? plan.componentLoad.massKg, cog: edit.cog }),
    [plan.snapshot, plan.componentLoad.massKg, edit.override, edit.cog],
  );
  // The core's input as the server builds it on save, and its solve: figures in the render of the move.
  const input = useMemo(
    () => editorArrangementInput(edit, planned, { picks, details: plan.details, ruleSet, todayIso, tables }),
    [edit, planned, picks, plan.details, ruleSet, todayIso, tables],
  );
  const live = useLiveSolve(input, tables);
  // The /api/solve body of a bridle: the gear picker judges each candidate by the plan's own check with it.
  const body = useMemo(
    () => (edit.arrangement.kind === "bridle" && input.liftPoints.length > 0 ? toSolveBody(input) : null),
    [edit.arrangement.kind, input],
  );

  const doc = useMemo(
    () => ({
      title: plan.title,
      arrangement: edit.arrangement,
      rigging: edit.rigging,
      details: plan.details,
      load: {
        liftPoints: edit.liftPoints.map((p) => ({ label: p.label, position: p.position })),
        override: edit.override,
      },
    }),
    [edit, plan.title, plan.details],
  );
  const [save, saveNow] = useAutosave(plan.id, plan.version, doc, canEdit, setSavedResults);

  // The figures on the drawing, bridle and beam alike: the live solve in the browser.
  const shown: ResultState = live;
  const solution = shown.kind === "done" && shown.status === 200 ? (shown.body as LiveSolution) : null;

  const levelHookZ = edit.arrangement.mode === "level" ? edit.arrangement.hookHeightM : null;
  const hook = useMemo(
    () => solution?.hook ?? (levelHookZ !== null ? { x: edit.cog.x, y: edit.cog.y, z: levelHookZ } : null),
    [solution, levelHookZ, edit.cog],
  );
  const legFigures = useMemo((): LegFigure[] => {
    const levelChange = (id: string) => {
      const change = solution?.levelling?.legs.find((l) => l.liftPointId === id)?.changeM ?? 0;
      return solution && solution.tiltDeg >= 0.05 && Math.abs(change) >= LEVELLING_STEP_M
        ? ` · to level: ${change < 0 ? "shorten" : "lengthen"} ${formatLength(Math.abs(change), units)}`
        : "";
    };
    return (solution?.legs ?? []).map((leg) => ({
      label: leg.liftPointId,
      text: `${leg.liftPointId}: ${tensionText(leg.tensionKn, leg.tensionKg, units)} · ${leg.angleFromVerticalDeg.toFixed(1)}°${levelChange(leg.liftPointId)}`,
      tone: legTone(standing(solution?.checks ?? [], leg.liftPointId)),
      slack: leg.slack,
    }));
  }, [solution, units]);

  // The handle the arrow keys move in a focused drawing; the first lift point until another is chosen.
  const handles = useMemo(() => movableHandles(edit), [edit]);
  const selected = handles.find((h) => handleKey(h) === selectedKey) ?? handles[0] ?? null;
  const selectHandle = useCallback((h: Handle) => setSelectedKey(handleKey(h)), []);
  const toggleSnap = useCallback(() => setSnap((s) => !s), []);

  // Editor-wide shortcuts. Single keys (arrows, G, + and -) belong to the focused drawing only, so they never
  // take over the page's scrolling or a key typed elsewhere.
  const onKey = useCallback(
    (e: KeyboardEvent) => {
      const target = e.target as HTMLElement | null;
      const mod = e.ctrlKey || e.metaKey;
      if (mod && !e.shiftKey && !e.altKey && e.key.toLowerCase() === "s") {
        e.preventDefault();
        // A number being typed is committed on blur; send the save once that change has rendered.
        if (target instanceof HTMLInputElement) {
          target.blur();
          target.focus();
        }
        setTimeout(saveNow, 0);
        return;
      }
      // In a text box or list, Ctrl+Z is the field's own; on a checkbox, radio or button it is the editor's.
      const typing =
        target instanceof HTMLTextAreaElement ||
        target instanceof HTMLSelectElement ||
        (target instanceof HTMLInputElement && !["checkbox", "radio"].includes(target.type));
      if (typing) return;
      if (mod && e.key.toLowerCase() === "z" && !e.shiftKey) {
        e.preventDefault();
        dispatch({ type: "undo" });
      } else if (mod && (e.key.toLowerCase() === "y" || (e.key.toLowerCase() === "z" && e.shiftKey))) {
        e.preventDefault();
        dispatch({ type: "redo" });
      }
    },
    [saveNow],
  );
  useEffect(() => {
    window.addEventListener("keydown", onKey);
    return () => window.removeEventListener("keydown", onKey);
  }, [onKey]);

  const beam = useMemo(() => editorBeamPlacement(edit, picks), [edit, picks]);
  const views = viewsLayout(viewsWidth);
  const viewWidth = views.viewWidth;
  const viewHeight = Math.max(260, Math.min(460, Math.round(viewWidth * 0.75)));
  const usedPoints = useMemo(
    () => edit.liftPoints.filter((p) => edit.arrangement.liftPointLabels.includes(p.label)),
    [edit.liftPoints, edit.arrangement.liftPointLabels],
  );
  // The chart sweeps the layout at 80 hook heights: it follows once the planner pauses, never in a move's frame.
  const chartPoints = useMemo(
    () =>
      usedPoints.map((p) => ({
        id: p.label,
        position: p.position,
        axis: p.axis,
        ...(p.thread ? { thread: p.thread } : {}),
      })),
    [usedPoints],
  );
  const chart = useSettledValue(
    useMemo(
      () => ({ massKg: planned.massKg, cog: edit.cog, points: chartPoints, rigging: body?.rigging }),
      [planned.massKg, edit.cog, chartPoints, body],
    ),
    CHART_SETTLE_MS,
  );

  return (
    <div className="space-y-4">
      <div
        className="no-print flex flex-wrap items-center gap-2 rounded border border-rule bg-card px-3 py-2"
        role="toolbar"
        aria-label="Editor"
      >
        <Button
          type="button"
          tone="secondary"
          onClick={() => dispatch({ type: "undo" })}
          disabled={!canUndo(state)}
          title="Undo (Ctrl+Z)"
          aria-keyshortcuts="Control+Z"
        >
          Undo
        </Button>
        <Button
          type="button"
          tone="secondary"
          onClick={() => dispatch({ type: "redo" })}
          disabled={!canRedo(state)}
          title="Redo (Ctrl+Shift+Z or Ctrl+Y)"
          aria-keyshortcuts="Control+Shift+Z Control+Y"
        >
          Redo
        </Button>
        {canEdit && (
          <Button
            type="button"
            tone="secondary"
            onClick={saveNow}
            disabled={save.kind !== "pending"}
            title="Save now (Ctrl+S)"
            aria-keyshortcuts="Control+S"
          >
            Save now
          </Button>
        )}
        <label className="ml-2 flex items-center gap-1 text-sm">
          <input type="checkbox" checked={snap} onChange={(e) => setSnap(e.target.checked)} /> Snap to grid and lift
          points (G)
        </label>
        <span className="ml-auto text-sm" role="status" aria-live="polite" data-testid="save-status">
          {save.kind === "saved" && (save.at ? `Saved · version ${save.version}` : `Version ${save.version}`)}
          {save.kind === "pending" && "Unsaved changes…"}
          {save.kind === "saving" && "Saving…"}
          {save.kind === "error" && <span className="text-fail">{save.message}</span>}
        </span>
      </div>
      {save.kind === "conflict" && (
        <div role="alert" className="rounded border border-fail/40 bg-fail-soft p-3 text-sm text-fail">
          {save.message}{" "}
          <button type="button" className="font-semibold underline" onClick={() => window.location.reload()}>
            Reload the plan
          </button>
        </div>
      )}
      <p id={helpId} className="text-xs text-ink-soft">
        Drag the lift points in either view and the hook up and down in the elevation (level mode); wheel to zoom, drag
        the background to pan, double-click a lift point to use it or not. From the keyboard: choose what to move, Tab
        into a drawing and use the arrow keys (Shift for ten grid steps); + and − zoom about it, 0 fits the view, G
        turns snapping on and off; Ctrl+S saves at once. Grid {formatLength(gridM, units)}.
      </p>
      {canEdit && (
        <HandleRadios handles={handles} selectedKey={selected && handleKey(selected)} onSelect={selectHandle} />
      )}

      <div ref={viewsRef} className="grid gap-4" style={views.style}>
        {(["elevation", "plan"] as const).map((view) => (
          <figure
            key={view}
            className="overflow-hidden rounded border border-rule bg-white"
            data-testid={`view-${view}`}
          >
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
                  outline={view === "elevation" ? plan.snapshot.outlineElevation : plan.snapshot.outlinePlan}
                  hook={hook}
                  legs={legFigures}
                  units={units}
                  gridM={gridM}
                  snap={snap}
                  dispatch={canEdit ? dispatch : noDispatch}
                  backdrop={view === "elevation" ? tracing.backdrop : null}
                  beam={beam}
                  onPick={tracing.calibration && view === "elevation" ? tracing.pickForCalibration : null}
                  selected={canEdit ? selected : null}
                  onSelect={selectHandle}
                  onToggleSnap={toggleSnap}
                  label={`${view === "elevation" ? "Elevation" : "Plan"} drawing${canEdit && selected ? `, moving ${handleName(selected)}` : ""}`}
                  describedBy={helpId}
                />
              </Suspense>
            ) : (
              <div style={{ height: viewHeight }} />
            )}
          </figure>
        ))}
      </div>
      {beam?.problem && (
        <p className="text-sm text-warn" role="status">
          The beam cannot be drawn yet: {beam.problem}
        </p>
      )}
      <p className="text-xs text-ink-soft">
        Leg colours follow the worst check on each leg, always with the figures written beside it:{" "}
        <span className="font-semibold text-pass">green pass</span>,{" "}
        <span className="font-semibold text-warn">amber warn</span>,{" "}
        <span className="font-semibold text-fail">red fail</span>, grey not yet checked (no gear allocated). A dashed
        leg is slack.
      </p>

      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <ArrangementPanel
          edit={edit}
          dispatch={dispatch}
          canEdit={canEdit}
          units={units}
          solution={solution}
          picks={picks}
        >
          <MemoLoadOverridePanel
            edit={edit}
            dispatch={dispatch}
            canEdit={canEdit}
            units={units}
            component={component}
          />
          <MemoTracingPanel files={files} units={units} tracing={tracing} />
        </ArrangementPanel>

        <div className="space-y-2">
          <MemoFiguresDiffer live={live} saved={savedResults} save={save} units={units} />
          <MemoLiveResults state={shown} units={units} />
        </div>
      </div>

      <MemoGearTable
        edit={edit}
        dispatch={dispatch}
        canEdit={canEdit}
        units={units}
        snapshot={planned}
        solution={solution}
        usedPoints={usedPoints}
        picks={picks}
        addPick={addPick}
        body={body}
        tables={tables}
      />

      {edit.arrangement.kind === "bridle" && (
        <MemoHookHeightChart
          massKg={chart.massKg}
          cog={chart.cog}
          points={chart.points}
          rigging={chart.rigging}
          tables={tables}
          ruleSet={ruleSet}
          currentHookZM={hook?.z ?? edit.arrangement.hookHeightM}
          units={units}
        />
      )}
    </div>
  );
}

export type { EditorAction };
