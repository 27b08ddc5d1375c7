// The plan editor: two linked views of the load drawn to scale (Konva, browser only), a
// properties panel for exact values, live results from /api/solve, gear allocation, the
// hook-height chart and autosave through PUT /api/plans/:planId.
import { lazy, Suspense, useCallback, useEffect, useId, useMemo, useReducer, useRef, useState } from "react";
import type { ComponentDefinition } from "~/loads/component-definition";
import type { Backdrop, LegFigure } from "~/components/plan-canvas.client";
import { Button } from "~/components/ui/form";
import { HookHeightChart } from "~/components/hook-height-chart";
import { GearPicker } from "~/components/gear-picker";
import { LiveResults, type ResultState } from "~/components/live-results";
import { tensionText } from "~/components/results/leg-table";
import { worstVerdictForLeg, type AnyCheck } from "~/plans/check-text";
import {
  EYE_PLANE_LABELS,
  EYE_PLANES,
  HITCH_LABELS,
  HITCHES,
  type PlanDetails,
  type PlanResults,
  type RiggingAllocation,
  type Arrangement,
} from "~/plans/document";
import {
  calibrateImageScale,
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
  type PlanEdit,
} from "~/plans/editor-state";
import { assembleRigging, GEAR_ROLE_LABELS, type GearPick, type GearRole } from "~/plans/rigging";
import { solveLevel } from "~/statics/bridle";
import type { RuleSetId } from "~/statics/reference";
import { HitchSelect, hitchesForLeg } from "~/components/hitch-select";
import {
  formatLength,
  fromDisplayLength,
  inputNumber,
  lengthUnitLabel,
  toDisplayLength,
  type Units,
} from "~/utils/format";

const PlanCanvas = lazy(() => import("~/components/plan-canvas.client"));

export type EditorPlan = {
  id: number;
  title: string;
  status: string;
  version: number;
  snapshot: ComponentDefinition;
  arrangement: Arrangement;
  rigging: RiggingAllocation;
  details: PlanDetails;
  results: PlanResults | null;
};

export type EditorFile = { fileId: number; name: string; caption: string };

type SaveState =
  | { kind: "saved"; version: number; at: Date | null }
  | { kind: "pending" | "saving"; version: number }
  | { kind: "conflict"; version: number; message: string }
  | { kind: "error"; version: number; message: string };

function toEdit(plan: EditorPlan): PlanEdit {
  return {
    cog: plan.snapshot.cog,
    liftPoints: plan.snapshot.liftPoints.map((p) => ({
      label: p.label,
      position: p.position,
      axis: p.axis,
      thread: p.thread,
    })),
    arrangement: plan.arrangement,
    rigging: plan.rigging,
  };
}

/** The /api/solve body for the edit (bridles only), with the rigging assembled from the picks. */
function solveBodyFor(
  edit: PlanEdit,
  snapshot: ComponentDefinition,
  picks: ReadonlyMap<number, GearPick>,
  details: PlanDetails,
  ruleSet: RuleSetId,
) {
  if (edit.arrangement.kind !== "bridle") return null;
  const byLabel = new Map(edit.liftPoints.map((p) => [p.label, p]));
  const liftPoints = edit.arrangement.liftPointLabels
    .map((label) => byLabel.get(label))
    .filter((p) => p !== undefined)
    .map((p) => ({ id: p.label, ...p.position, axis: p.axis, ...(p.thread ? { thread: p.thread } : {}) }));
  if (liftPoints.length === 0) return null;
  const underside = Math.min(...snapshot.outlineElevation.map((p) => p[1]));
  return {
    load: { massKg: snapshot.massKg, cog: edit.cog },
    liftPoints,
    ...(edit.arrangement.mode === "level"
      ? { hook: { z: edit.arrangement.hookHeightM } }
      : {
          legLengths: Object.fromEntries(
            edit.arrangement.liftPointLabels.map((l) => [l, edit.arrangement.legLengthsM[l] ?? 0]),
          ),
        }),
    rigging: assembleRigging(edit.rigging, picks, {
      contingencyPct: snapshot.contingencyPct,
      floorClearanceM: details.floorClearanceM,
      loadUndersideZM: underside,
    }),
    ruleSet,
    ...(details.liftDate ? { liftDate: details.liftDate } : {}),
  };
}

/** Fetches /api/solve for the body, debounced; answers to superseded bodies are dropped. */
function useLiveSolve(body: unknown | null): ResultState {
  const [state, setState] = useState<ResultState>({ kind: "idle" });
  const key = body === null ? null : JSON.stringify(body);
  const sequence = useRef(0);
  useEffect(() => {
    if (key === null) return;
    const id = ++sequence.current;
    const controller = new AbortController();
    setState((s) => (s.kind === "done" ? { ...s, stale: true } : { kind: "loading" }));
    const timer = setTimeout(async () => {
      try {
        const res = await fetch("/api/solve", {
          method: "POST",
          body: key,
          headers: { "Content-Type": "application/json" },
          signal: controller.signal,
        });
        const json = (await res.json()) as unknown;
        if (id !== sequence.current) return;
        setState({ kind: "done", status: res.status, body: json, stale: false });
      } catch (error) {
        if (controller.signal.aborted || id !== sequence.current) return;
        setState({
          kind: "failed",
          message: error instanceof Error ? error.message : "The figures could not be fetched.",
        });
      }
    }, 180);
    return () => {
      clearTimeout(timer);
      controller.abort();
    };
  }, [key]);
  return state;
}

/**
 * Saves the plan a moment after the last change; a stale version stops saving and says so. Also
 * returns `saveNow`, which sends a waiting change at once (the Save now button, Ctrl+S).
 */
function useAutosave(
  planId: number,
  initialVersion: number,
  doc: unknown,
  enabled: boolean,
  onSaved: (results: PlanResults | null) => void,
) {
  const [save, setSave] = useState<SaveState>({ kind: "saved", version: initialVersion, at: null });
  const versionRef = useRef(initialVersion);
  const first = useRef(true);
  const blocked = useRef(false);
  const flush = useRef<(() => void) | null>(null);
  const key = JSON.stringify(doc);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    if (!enabled || blocked.current) return;
    setSave({ kind: "pending", version: versionRef.current });
    const send = async () => {
      flush.current = null;
      setSave({ kind: "saving", version: versionRef.current });
      try {
        const res = await fetch(`/api/plans/${planId}`, {
          method: "PUT",
          headers: { "Content-Type": "application/json" },
          body: JSON.stringify({ ...(JSON.parse(key) as object), version: versionRef.current }),
        });
        const json = (await res.json()) as { version?: number; error?: string; results?: PlanResults | null };
        if (res.ok && typeof json.version === "number") {
          versionRef.current = json.version;
          setSave({ kind: "saved", version: json.version, at: new Date() });
          onSaved(json.results ?? null);
        } else if (res.status === 409) {
          blocked.current = true;
          setSave({
            kind: "conflict",
            version: versionRef.current,
            message: json.error ?? "Someone else saved this plan.",
          });
        } else {
          setSave({
            kind: "error",
            version: versionRef.current,
            message: json.error ?? `The plan could not be saved (${res.status}).`,
          });
        }
      } catch {
        setSave({
          kind: "error",
          version: versionRef.current,
          message: "The plan could not be saved: the server did not answer. It will try again on your next change.",
        });
      }
    };
    const timer = setTimeout(send, 900);
    flush.current = () => {
      clearTimeout(timer);
      void send();
    };
    return () => {
      clearTimeout(timer);
      flush.current = null;
    };
    // onSaved is stable enough; saving follows the document only.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [key, enabled, planId]);
  const saveNow = useCallback(() => flush.current?.(), []);
  return [save, saveNow] as const;
}

function useElementWidth<T extends HTMLElement>() {
  const ref = useRef<T>(null);
  const [width, setWidth] = useState(0);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const observer = new ResizeObserver(([entry]) => setWidth(Math.floor(entry!.contentRect.width)));
    observer.observe(el);
    return () => observer.disconnect();
  }, []);
  return [ref, width] as const;
}

function NumberInput({
  label,
  valueM,
  units,
  onCommit,
  disabled,
}: {
  label: string;
  valueM: number;
  units: Units;
  onCommit: (valueM: number) => void;
  disabled?: boolean;
}) {
  const shown = inputNumber(toDisplayLength(valueM, units), units === "metric" ? 0 : 2);
  const [text, setText] = useState(shown);
  useEffect(() => setText(shown), [shown]);
  const commit = () => {
    const n = Number(text.replace(/,/g, ""));
    if (text.trim() !== "" && Number.isFinite(n)) onCommit(fromDisplayLength(n, units));
    else setText(shown);
  };
  return (
    <label className="block text-xs">
      <span className="text-ink-soft">{label}</span>
      <input
        className="mt-0.5 block w-full rounded border border-rule px-2 py-1 text-sm"
        inputMode="decimal"
        value={text}
        disabled={disabled}
        onChange={(e) => setText(e.target.value)}
        onBlur={commit}
        onKeyDown={(e) => {
          if (e.key === "Enter") commit();
        }}
      />
    </label>
  );
}

export function PlanEditor({
  plan,
  units,
  initialPicks,
  files,
  canEdit,
  ruleSet,
}: {
  plan: EditorPlan;
  units: Units;
  initialPicks: GearPick[];
  files: EditorFile[];
  canEdit: boolean;
  ruleSet: RuleSetId;
}) {
  const [state, dispatch] = useReducer(editorReducer, plan, (p) => initialEditorState(toEdit(p)));
  const edit = state.present;
  const [snap, setSnap] = useState(true);
  const [selectedKey, setSelectedKey] = useState<string | null>(null);
  const helpId = useId();
  const [picks, setPicks] = useState(() => new Map(initialPicks.map((p) => [p.id, p])));
  const [savedResults, setSavedResults] = useState<PlanResults | null>(plan.results);
  const [backdrop, setBackdrop] = useState<Backdrop | null>(null);
  const [calibration, setCalibration] = useState<{
    fileId: number;
    image: HTMLImageElement;
    clicks: Array<{ x: number; y: number; a: number; b: number }>;
  } | null>(null);
  const [calibrationDistance, setCalibrationDistance] = useState("");
  const [viewsRef, viewsWidth] = useElementWidth<HTMLDivElement>();
  const gridM = gridStepM(units);
  const lu = lengthUnitLabel(units);

  const addPick = useCallback((pick: GearPick) => setPicks((m) => new Map(m).set(pick.id, pick)), []);

  const body = useMemo(
    () => solveBodyFor(edit, plan.snapshot, picks, plan.details, ruleSet),
    [edit, plan.snapshot, picks, plan.details, ruleSet],
  );
  const live = useLiveSolve(body);

  const doc = useMemo(
    () => ({
      title: plan.title,
      arrangement: edit.arrangement,
      rigging: edit.rigging,
      details: plan.details,
      load: { cog: edit.cog, liftPoints: edit.liftPoints.map((p) => ({ label: p.label, position: p.position })) },
    }),
    [edit, plan.title, plan.details],
  );
  const [save, saveNow] = useAutosave(plan.id, plan.version, doc, canEdit, setSavedResults);

  // The figures on the drawing: the live answer for bridles, the saved server result for beams.
  const shown: ResultState =
    edit.arrangement.kind === "bridle"
      ? live
      : savedResults
        ? {
            kind: "done",
            status: savedResults.status,
            body: savedResults.body,
            stale: save.kind === "pending" || save.kind === "saving",
          }
        : { kind: "idle" };
  const solution =
    shown.kind === "done" && shown.status === 200
      ? (shown.body as {
          hook: { x: number; y: number; z: number };
          legs: Array<{
            liftPointId: string;
            lengthM: number;
            tensionKn: number;
            tensionKg: number;
            angleFromVerticalDeg: number;
            slack: boolean;
          }>;
          checks?: AnyCheck[];
          tiltDeg: number;
        })
      : null;

  const hook =
    solution?.hook ??
    (edit.arrangement.mode === "level" ? { x: edit.cog.x, y: edit.cog.y, z: edit.arrangement.hookHeightM } : null);
  const legFigures: LegFigure[] = (solution?.legs ?? []).map((leg) => ({
    label: leg.liftPointId,
    text: `${leg.liftPointId}: ${tensionText(leg.tensionKn, leg.tensionKg, units)} · ${leg.angleFromVerticalDeg.toFixed(1)}°`,
    tone: worstVerdictForLeg(solution?.checks ?? [], leg.liftPointId) ?? "none",
    slack: leg.slack,
  }));

  // The handle the arrow keys move in a focused drawing; the first lift point until another is chosen.
  const handles = movableHandles(edit);
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

  function setMode(mode: "level" | "lengths") {
    if (mode === edit.arrangement.mode) return;
    // Switching to given lengths starts from the lengths of the level solution (the slings a level lift needs).
    const legLengthsM =
      mode === "lengths" && solution
        ? Object.fromEntries(solution.legs.map((l) => [l.liftPointId, Number(l.lengthM.toFixed(4))]))
        : undefined;
    dispatch({ type: "set-mode", mode, legLengthsM });
  }

  function useAllocatedSlingLengths() {
    const lengths: Record<string, number> = {};
    for (const label of edit.arrangement.liftPointLabels) {
      const slingId = edit.rigging.legs[label]?.slingItemId;
      const length = slingId !== undefined ? picks.get(slingId)?.lengthM : null;
      if (length) lengths[label] = length;
    }
    dispatch({ type: "set-mode", mode: "lengths", legLengthsM: { ...edit.arrangement.legLengthsM, ...lengths } });
  }

  // Given lengths: the change in each leg that would level the load, keeping the hook at the height it settled at.
  const levelling = useMemo(() => {
    if (edit.arrangement.mode !== "lengths" || !solution || solution.tiltDeg < 0.05) return null;
    const points = edit.liftPoints
      .filter((p) => edit.arrangement.liftPointLabels.includes(p.label))
      .map((p) => ({ id: p.label, position: p.position, axis: p.axis }));
    const level = solveLevel({ massKg: plan.snapshot.massKg, cog: edit.cog }, points, solution.hook.z);
    if (!level.ok) return null;
    return level.solution.legs.map((l) => ({
      label: l.liftPointId,
      changeM: l.lengthM - (edit.arrangement.legLengthsM[l.liftPointId] ?? 0),
    }));
  }, [edit, solution, plan.snapshot.massKg]);

  function startCalibration(fileId: number) {
    const image = new window.Image();
    image.onload = () => {
      setCalibration({ fileId, image, clicks: [] });
      setBackdrop({
        image,
        metresPerPixel: plan.snapshot.lengthM / image.width,
        originA: -plan.snapshot.lengthM / 2,
        originB: plan.snapshot.heightM,
        opacity: 0.5,
      });
    };
    image.src = `/files/${fileId}`;
  }

  function pickForCalibration(point: { a: number; b: number; x: number; y: number }) {
    setCalibration((c) => (c ? { ...c, clicks: [...c.clicks.slice(-1), point] } : c));
  }

  function applyCalibration() {
    if (!calibration || !backdrop || calibration.clicks.length < 2) return;
    const [p1, p2] = calibration.clicks;
    if (!p1 || !p2) return;
    // The clicks are in world metres at the drawing's current scale; convert back to image pixels.
    const toPixel = (p: { a: number; b: number }) => ({
      x: (p.a - backdrop.originA) / backdrop.metresPerPixel,
      y: (backdrop.originB - p.b) / backdrop.metresPerPixel,
    });
    const distanceM = fromDisplayLength(Number(calibrationDistance), units);
    const metresPerPixel = calibrateImageScale(toPixel(p1), toPixel(p2), distanceM);
    if (metresPerPixel === null) return;
    setBackdrop({ ...backdrop, metresPerPixel });
    setCalibration(null);
    setCalibrationDistance("");
  }

  const beamZM =
    edit.arrangement.kind === "beam" && edit.arrangement.beam
      ? Math.max(
          ...edit.liftPoints.filter((p) => edit.arrangement.liftPointLabels.includes(p.label)).map((p) => p.position.z),
        ) + edit.arrangement.beam.dropLengthM
      : null;
  const viewWidth = viewsWidth >= 900 ? Math.floor((viewsWidth - 16) / 2) : viewsWidth;
  const viewHeight = Math.max(260, Math.min(460, Math.round(viewWidth * 0.75)));
  const usedPoints = edit.liftPoints.filter((p) => edit.arrangement.liftPointLabels.includes(p.label));
  const legLoadKg = (label: string) => solution?.legs.find((l) => l.liftPointId === label)?.tensionKg ?? null;

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
        Drag the lift points and the CoG in either view and the hook up and down in the elevation (level mode); wheel to
        zoom, drag the background to pan, double-click a lift point to use it or not. From the keyboard: choose what to
        move, Tab into a drawing and use the arrow keys (Shift for ten grid steps); + and − zoom about it, 0 fits the
        view, G turns snapping on and off; Ctrl+S saves at once. Grid {formatLength(gridM, units)}.
      </p>
      {canEdit && (
        <fieldset className="no-print flex flex-wrap items-center gap-x-4 gap-y-1 text-sm">
          <legend className="float-left mr-2 font-semibold">The arrow keys move</legend>
          {handles.map((h) => (
            <label key={handleKey(h)} className="flex items-center gap-1">
              <input
                type="radio"
                name="moved-handle"
                value={handleKey(h)}
                checked={selected !== null && handleKey(selected) === handleKey(h)}
                onChange={() => selectHandle(h)}
              />
              {handleName(h)}
            </label>
          ))}
        </fieldset>
      )}

      <div ref={viewsRef} className="grid gap-4 xl:grid-cols-2">
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
                  dispatch={canEdit ? dispatch : () => undefined}
                  backdrop={view === "elevation" ? backdrop : null}
                  beamZM={beamZM}
                  onPick={calibration && view === "elevation" ? pickForCalibration : null}
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
      <p className="text-xs text-ink-soft">
        Leg colours follow the worst check on each leg, always with the figures written beside it:{" "}
        <span className="font-semibold text-pass">green pass</span>,{" "}
        <span className="font-semibold text-warn">amber warn</span>,{" "}
        <span className="font-semibold text-fail">red fail</span>, grey not yet checked (no gear allocated). A dashed
        leg is slack.
      </p>

      <div className="grid gap-4 lg:grid-cols-[minmax(0,1fr)_minmax(0,1fr)]">
        <section className="space-y-4 rounded border border-rule bg-card p-4" aria-labelledby="arrangement-heading">
          <h2 id="arrangement-heading" className="text-lg">
            Arrangement
          </h2>
          <fieldset className="flex flex-wrap gap-4 text-sm" disabled={!canEdit}>
            <legend className="sr-only">How the load is hung</legend>
            <label className="flex items-center gap-1">
              <input
                type="radio"
                name="hung-by"
                checked={edit.arrangement.kind === "bridle"}
                onChange={() => dispatch({ type: "set-kind", kind: "bridle" })}
              />{" "}
              Legs to one hook
            </label>
            <label className="flex items-center gap-1">
              <input
                type="radio"
                name="hung-by"
                checked={edit.arrangement.kind === "beam"}
                onChange={() =>
                  dispatch({
                    type: "set-kind",
                    kind: "beam",
                    beam: edit.arrangement.beam ?? {
                      massKg: 60,
                      wllKg: 2000,
                      lengthM: Math.max(plan.snapshot.lengthM, 0.5),
                      dropLengthM: 0.6,
                    },
                  })
                }
              />{" "}
              Lifting beam with vertical drops
            </label>
          </fieldset>
          {edit.arrangement.kind === "bridle" && (
            <fieldset className="flex flex-wrap gap-4 text-sm" disabled={!canEdit}>
              <legend className="sr-only">What is given</legend>
              <label className="flex items-center gap-1">
                <input
                  type="radio"
                  name="given"
                  checked={edit.arrangement.mode === "level"}
                  onChange={() => setMode("level")}
                />{" "}
                Level lift: the hook height gives the leg lengths
              </label>
              <label className="flex items-center gap-1">
                <input
                  type="radio"
                  name="given"
                  checked={edit.arrangement.mode === "lengths"}
                  onChange={() => setMode("lengths")}
                />{" "}
                Given sling lengths: find the tilt
              </label>
            </fieldset>
          )}
          <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
            {edit.arrangement.mode === "level" && (
              <NumberInput
                label={`Hook height z (${lu})`}
                valueM={edit.arrangement.hookHeightM}
                units={units}
                disabled={!canEdit}
                onCommit={(v) => dispatch({ type: "set-hook-height", hookHeightM: v })}
              />
            )}
            {(["x", "y", "z"] as const).map((axis) => (
              <NumberInput
                key={axis}
                label={`CoG ${axis} (${lu})`}
                valueM={edit.cog[axis]}
                units={units}
                disabled={!canEdit}
                onCommit={(v) => dispatch({ type: "move-cog", cog: { ...edit.cog, [axis]: v } })}
              />
            ))}
          </div>
          {edit.arrangement.kind === "beam" && edit.arrangement.beam && (
            <p className="text-sm text-ink-soft">
              Beam: {formatLength(edit.arrangement.beam.lengthM, units)} long, drops{" "}
              {formatLength(edit.arrangement.beam.dropLengthM, units)}, its mass and WLL as on the plan&apos;s details.
              Beam figures are worked out by the server on each save.
            </p>
          )}
          <div className="overflow-x-auto">
            <table className="w-full table-fixed">
              <thead>
                <tr>
                  <th scope="col" className="w-12">
                    Use
                  </th>
                  <th scope="col" className="w-20">
                    Lift point
                  </th>
                  <th scope="col">x ({lu})</th>
                  <th scope="col">y ({lu})</th>
                  <th scope="col">z ({lu})</th>
                  {edit.arrangement.mode === "lengths" && <th scope="col">Sling length ({lu})</th>}
                </tr>
              </thead>
              <tbody>
                {edit.liftPoints.map((p) => {
                  const used = edit.arrangement.liftPointLabels.includes(p.label);
                  return (
                    <tr key={p.label}>
                      <td>
                        <input
                          type="checkbox"
                          aria-label={`Use lift point ${p.label}`}
                          checked={used}
                          disabled={!canEdit}
                          onChange={() => dispatch({ type: "toggle-lift-point", label: p.label })}
                        />
                      </td>
                      <td className="font-semibold">
                        {p.label} {p.thread && <span className="font-normal text-ink-soft">{p.thread}</span>}
                      </td>
                      {(["x", "y", "z"] as const).map((axis) => (
                        <td key={axis}>
                          <NumberInput
                            label={`${p.label} ${axis}`}
                            valueM={p.position[axis]}
                            units={units}
                            disabled={!canEdit}
                            onCommit={(v) =>
                              dispatch({
                                type: "move-lift-point",
                                label: p.label,
                                position: { ...p.position, [axis]: v },
                              })
                            }
                          />
                        </td>
                      ))}
                      {edit.arrangement.mode === "lengths" && (
                        <td>
                          {used && (
                            <NumberInput
                              label={`Sling length to ${p.label}`}
                              valueM={edit.arrangement.legLengthsM[p.label] ?? 0}
                              units={units}
                              disabled={!canEdit}
                              onCommit={(v) => dispatch({ type: "set-leg-length", label: p.label, lengthM: v })}
                            />
                          )}
                        </td>
                      )}
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </div>
          {edit.arrangement.mode === "lengths" && (
            <div className="space-y-2 text-sm">
              <Button type="button" tone="secondary" onClick={useAllocatedSlingLengths} disabled={!canEdit}>
                Take the lengths of the allocated slings
              </Button>
              {levelling && (
                <div className="rounded border border-warn/40 bg-warn-soft p-2" data-testid="levelling">
                  <p className="font-semibold">To hang level (hook kept at the height it settles at):</p>
                  <ul>
                    {levelling.map((l) => (
                      <li key={l.label}>
                        Leg {l.label}:{" "}
                        {Math.abs(l.changeM) < 0.0005
                          ? "no change"
                          : `${l.changeM > 0 ? "lengthen" : "shorten"} by ${formatLength(Math.abs(l.changeM), units)}`}
                      </li>
                    ))}
                  </ul>
                </div>
              )}
            </div>
          )}
          {files.length > 0 && (
            <div className="border-t border-rule pt-3 text-sm">
              <p className="font-semibold">Trace over a drawing (elevation view)</p>
              <div className="mt-1 flex flex-wrap items-center gap-2">
                {files.map((f) => (
                  <Button key={f.fileId} type="button" tone="secondary" onClick={() => startCalibration(f.fileId)}>
                    Put {f.caption || f.name} behind
                  </Button>
                ))}
                {backdrop && (
                  <Button type="button" tone="secondary" onClick={() => setBackdrop(null)}>
                    Remove the drawing
                  </Button>
                )}
              </div>
              {calibration && (
                <div className="mt-2 space-y-2 rounded border border-steel/30 bg-steel-soft p-2">
                  <p>
                    Set its scale: click two points on the drawing whose distance you know ({calibration.clicks.length}{" "}
                    of 2 clicked), then type the distance.
                  </p>
                  <label className="block">
                    Distance between them ({lu})
                    <input
                      className="ml-2 w-28 rounded border border-rule px-2 py-1"
                      inputMode="decimal"
                      value={calibrationDistance}
                      onChange={(e) => setCalibrationDistance(e.target.value)}
                    />
                  </label>
                  <Button
                    type="button"
                    onClick={applyCalibration}
                    disabled={calibration.clicks.length < 2 || !(Number(calibrationDistance) > 0)}
                  >
                    Set the scale
                  </Button>
                </div>
              )}
            </div>
          )}
        </section>

        <LiveResults state={shown} units={units} />
      </div>

      <section className="rounded border border-rule bg-card p-4" aria-labelledby="gear-heading">
        <h2 id="gear-heading" className="text-lg">
          Gear from the register
        </h2>
        <p className="mb-3 text-sm text-ink-soft">
          Search the register for each position. The picker marks what fits the lift point and the leg load, and items
          out of date or quarantined.
        </p>
        <div className="overflow-x-auto">
          <table className="min-w-[48rem]">
            <thead>
              <tr>
                <th scope="col">Leg</th>
                <th scope="col">Eyebolt</th>
                <th scope="col">Shackle</th>
                <th scope="col">Sling</th>
                <th scope="col">Hitch</th>
                <th scope="col">Eye or lug plane</th>
              </tr>
            </thead>
            <tbody>
              {usedPoints.map((p) => {
                const leg = edit.rigging.legs[p.label];
                const slot = (role: GearRole, key: "eyeboltItemId" | "shackleItemId" | "slingItemId") => (
                  <GearPicker
                    role={role}
                    label={`${GEAR_ROLE_LABELS[role]} for leg ${p.label}`}
                    selected={leg?.[key] !== undefined ? (picks.get(leg[key]!) ?? null) : null}
                    thread={role === "eyebolt" ? p.thread : null}
                    loadKg={legLoadKg(p.label)}
                    disabled={!canEdit}
                    units={units}
                    onPick={(pick) => {
                      if (pick) addPick(pick);
                      dispatch({ type: "allocate", label: p.label, slot: key, itemId: pick?.id ?? null });
                    }}
                  />
                );
                return (
                  <tr key={p.label}>
                    <td className="font-semibold">{p.label}</td>
                    <td>{slot("eyebolt", "eyeboltItemId")}</td>
                    <td>{slot("shackle", "shackleItemId")}</td>
                    <td>{slot("sling", "slingItemId")}</td>
                    <td>
                      <HitchSelect
                        label={p.label}
                        hitch={leg?.hitch ?? "straight"}
                        allowed={hitchesForLeg(leg, picks)}
                        disabled={!canEdit}
                        onChange={(hitch) => dispatch({ type: "set-hitch", label: p.label, hitch })}
                      />
                    </td>
                    <td>
                      <select
                        aria-label={`Eye or lug plane at leg ${p.label}`}
                        className="rounded border border-rule px-2 py-1 text-sm"
                        value={leg?.eyePlane ?? "pull"}
                        disabled={!canEdit}
                        onChange={(e) =>
                          dispatch({
                            type: "set-eye-plane",
                            label: p.label,
                            eyePlane: e.target.value as (typeof EYE_PLANES)[number],
                          })
                        }
                      >
                        {EYE_PLANES.map((plane) => (
                          <option key={plane} value={plane}>
                            {EYE_PLANE_LABELS[plane]}
                          </option>
                        ))}
                      </select>
                    </td>
                  </tr>
                );
              })}
              <tr>
                <td className="font-semibold">Top</td>
                <td colSpan={2}>
                  <span className="block text-xs text-ink-soft">Master link</span>
                  <GearPicker
                    role="masterLink"
                    label="Master link"
                    selected={
                      edit.rigging.masterLinkItemId !== undefined
                        ? (picks.get(edit.rigging.masterLinkItemId) ?? null)
                        : null
                    }
                    thread={null}
                    loadKg={plan.snapshot.massKg * (1 + plan.snapshot.contingencyPct / 100)}
                    disabled={!canEdit}
                    units={units}
                    onPick={(pick) => {
                      if (pick) addPick(pick);
                      dispatch({ type: "allocate", label: null, slot: "masterLinkItemId", itemId: pick?.id ?? null });
                    }}
                  />
                  <label className="mt-1 flex items-center gap-2 text-xs">
                    <input
                      type="checkbox"
                      checked={edit.rigging.hookTakesLegs === true}
                      disabled={!canEdit}
                      onChange={(e) => dispatch({ type: "set-hook-takes-legs", value: e.target.checked })}
                    />
                    No master link: the crane hook takes the legs directly
                  </label>
                </td>
                <td colSpan={3}>
                  <span className="block text-xs text-ink-soft">Crane or hoist</span>
                  <GearPicker
                    role="crane"
                    label="Crane or hoist"
                    selected={
                      edit.rigging.craneItemId !== undefined ? (picks.get(edit.rigging.craneItemId) ?? null) : null
                    }
                    thread={null}
                    loadKg={plan.snapshot.massKg * (1 + plan.snapshot.contingencyPct / 100)}
                    disabled={!canEdit}
                    units={units}
                    onPick={(pick) => {
                      if (pick) addPick(pick);
                      dispatch({ type: "allocate", label: null, slot: "craneItemId", itemId: pick?.id ?? null });
                    }}
                  />
                </td>
              </tr>
            </tbody>
          </table>
        </div>
      </section>

      {edit.arrangement.kind === "bridle" && (
        <HookHeightChart
          massKg={plan.snapshot.massKg}
          cog={edit.cog}
          points={usedPoints.map((p) => ({ id: p.label, position: p.position, axis: p.axis }))}
          currentHookZM={hook?.z ?? edit.arrangement.hookHeightM}
          units={units}
        />
      )}
    </div>
  );
}

export type { EditorAction };
