// The plan editor's drawing, in Konva: one view (elevation x-z or plan x-y) of the load with its
// outline, CoG, lift points, legs and hook, to scale with a grid and scale bar. Browser only:
// loaded with lazy() after hydration, never rendered on the server. The drawing is one tab stop:
// with focus, the arrow keys move the selected handle, + and - zoom, 0 fits the view, G snaps.
import type { BeamPlacement } from "~/statics/beam-placement";
import type Konva from "konva";
import { useMemo, useRef, useState } from "react";
import { Circle, Group, Image as KonvaImage, Layer, Line, Rect, Stage, Text } from "react-konva";
import { COLOURS } from "~/components/plan-canvas/colours";
import { FiguresBox } from "~/components/plan-canvas/figures-box";
import { boxOnScreen, hangingFrame } from "~/components/plan-canvas/hang";
import { BeamDrops, BridleLegs } from "~/components/plan-canvas/legs";
import { project, unproject } from "~/components/plan-canvas/projection";
import { ScaleBar } from "~/components/plan-canvas/scale-bar";
import {
  fitView,
  handleKey,
  handleName,
  nudgeHandle,
  scaleBarLengthM,
  screenToWorld,
  snapViewPoint,
  VIEW_AXES,
  worldToScreen,
  zoomAbout,
  type DrawingView,
  type EditorAction,
  type Handle,
  type PlanEdit,
  type Vec3,
  type ViewTransform,
} from "~/plans/editor-state";
import { coincidentLabels, placeFiguresBox } from "~/plans/drawing-layout";
import { planeTilts } from "~/statics/tilt";
import { formatAngle, formatLength, type Units } from "~/utils/format";

export type ViewKind = DrawingView;

export type LegFigure = { label: string; text: string; tone: "pass" | "warn" | "fail" | "none"; slack: boolean };

export type Backdrop = {
  image: HTMLImageElement;
  metresPerPixel: number;
  originA: number;
  originB: number;
  opacity: number;
};

export type PlanCanvasProps = {
  view: ViewKind;
  width: number;
  height: number;
  edit: PlanEdit;
  outline: ReadonlyArray<readonly [number, number]>;
  /** The hook point in the component frame, as solved (or as set, in level mode). */
  hook: Vec3 | null;
  legs: LegFigure[];
  units: Units;
  gridM: number;
  snap: boolean;
  dispatch: (action: EditorAction) => void;
  backdrop?: Backdrop | null;
  /** A beam arrangement: where the beam hangs (null placement when it cannot be placed yet); absent for a bridle. */
  beam?: { placement: BeamPlacement | null; problem: string | null } | null;
  /** When set, clicks report world points (for setting a drawing's scale) instead of editing. */
  onPick?: ((point: { a: number; b: number; x: number; y: number }) => void) | null;
  /** Shown, never edited (the review page): nothing can be dragged; wheel and drag still zoom and pan. */
  readOnly?: boolean;
  /** The handle the arrow keys move (shared by both views); pressing on a handle selects it. */
  selected: Handle | null;
  onSelect: (handle: Handle) => void;
  onToggleSnap: () => void;
  /** The drawing's name for assistive technology, and the id of the text that tells how to work it. */
  label: string;
  describedBy?: string;
};

/** The selected handle's place in this view, in words, for the drawing's live region. */
function describeHandle(handle: Handle, edit: PlanEdit, hook: Vec3 | null, view: ViewKind, units: Units) {
  const [ka, kb] = VIEW_AXES[view];
  const at = (p: Vec3) => `${ka} ${formatLength(p[ka], units)}, ${kb} ${formatLength(p[kb], units)}`;
  if (handle.kind === "hook") {
    if (!hook) return "Hook: not placed";
    return view === "elevation" ? `Hook: z ${formatLength(hook.z, units)}` : "Hook: moves up and down in the elevation";
  }
  if (handle.kind === "cog") return `CoG: ${at(edit.cog)}`;
  const point = edit.liftPoints.find((p) => p.label === handle.label);
  return point ? `${handleName(handle)}: ${at(point.position)}` : handleName(handle);
}

/**
 * One view of the plan, drawn to scale; lift points, CoG and (in elevation, level mode) the hook can be dragged.
 * On slings of given lengths the elevation shows the load as it hangs: turned about its CoG so the hook is plumb
 * above it (an outline drawn as a flat shape through the CoG). The view keeps the hook, load and legs in sight.
 */
export default function PlanCanvas(props: PlanCanvasProps) {
  const {
    view,
    width,
    height,
    edit,
    outline,
    hook,
    legs,
    units,
    gridM,
    snap,
    dispatch,
    backdrop,
    onPick,
    beam = null,
    readOnly = false,
    selected,
    onSelect,
  } = props;
  const stageRef = useRef<Konva.Stage>(null);
  const [focused, setFocused] = useState(false);

  const level = edit.arrangement.mode === "level";
  // The elevation turns the load to how it hangs on given lengths; the plan view and beams are drawn as set.
  const frame = useMemo(
    () =>
      view === "elevation" && !level && beam === null ? hangingFrame(edit.cog, hook) : hangingFrame(edit.cog, null),
    [view, level, beam, edit.cog, hook],
  );
  const P = (p: Vec3) => project(frame.toWorld(p), view);
  const outlineShown = useMemo(
    () =>
      outline.map(([a, b]) => {
        if (!frame.tilted) return { a, b };
        const p = frame.toWorld({ x: a, y: edit.cog.y, z: b });
        return project(p, view);
      }),
    [outline, frame, edit.cog.y, view],
  );

  const pts = [...outlineShown, ...edit.liftPoints.map((p) => P(p.position)), P(edit.cog)];
  if (hook) pts.push(P(hook));
  const as = pts.map((p) => p.a);
  const bs = pts.map((p) => p.b);
  const box = { minA: Math.min(...as), maxA: Math.max(...as), minB: Math.min(...bs), maxB: Math.max(...bs) };
  const [transform, setTransform] = useState<ViewTransform>(() => fitView(box, width, height));
  // Refit when the load or the view's size changes, and when an edit or a new solve takes the hook, load or legs
  // out of a view that showed them all (never against the user's own zoom or pan): adjusted while rendering.
  const boxKey = [box.minA, box.maxA, box.minB, box.maxB].map((v) => Math.round(v * 1000)).join(",");
  const [fittedFor, setFittedFor] = useState({ outline, view, width, height, boxKey, box });
  if (
    fittedFor.outline !== outline ||
    fittedFor.view !== view ||
    fittedFor.width !== width ||
    fittedFor.height !== height
  ) {
    setFittedFor({ outline, view, width, height, boxKey, box });
    setTransform(fitView(box, width, height));
  } else if (fittedFor.boxKey !== boxKey) {
    setFittedFor({ ...fittedFor, boxKey, box });
    if (boxOnScreen(transform, fittedFor.box, width, height, 0) && !boxOnScreen(transform, box, width, height, 0))
      setTransform(fitView(box, width, height));
  }

  const S = (a: number, b: number) => worldToScreen(transform, a, b);
  const usedLabels = new Set(edit.arrangement.liftPointLabels);
  const candidates = edit.liftPoints.map((p) => P(p.position));

  // The paper, backdrop and grid change only with the view (zoom, pan, size), never with a move: their own
  // layer, built once per view, so Konva draws the moved figures without drawing the grid again.
  const paper = useMemo(() => {
    const S = (a: number, b: number) => worldToScreen(transform, a, b);
    // Grid: the finest multiple of the step that keeps lines at least 12 px apart.
    let step = gridM;
    while (step * transform.scalePxPerM < 12) step *= 5;
    const topLeft = screenToWorld(transform, 0, 0);
    const bottomRight = screenToWorld(transform, width, height);
    const gridLines: Array<{ points: number[]; major: boolean }> = [];
    for (let a = Math.floor(topLeft.a / step) * step; a <= bottomRight.a; a += step) {
      const x = S(a, 0).x;
      gridLines.push({ points: [x, 0, x, height], major: Math.abs(a) < step / 2 });
    }
    for (let b = Math.floor(bottomRight.b / step) * step; b <= topLeft.b; b += step) {
      const y = S(0, b).y;
      gridLines.push({ points: [0, y, width, y], major: Math.abs(b) < step / 2 });
    }
    return (
      <Layer listening={false}>
        <Rect x={0} y={0} width={width} height={height} fill="#ffffff" />
        {backdrop && (
          <KonvaImage
            name="backdrop"
            image={backdrop.image}
            x={S(backdrop.originA, backdrop.originB).x}
            y={S(backdrop.originA, backdrop.originB).y}
            scaleX={backdrop.metresPerPixel * transform.scalePxPerM}
            scaleY={backdrop.metresPerPixel * transform.scalePxPerM}
            opacity={backdrop.opacity}
          />
        )}
        {gridLines.map((g, i) => (
          <Line key={i} points={g.points} stroke={g.major ? COLOURS.gridMajor : COLOURS.grid} strokeWidth={1} />
        ))}
      </Layer>
    );
  }, [transform, width, height, gridM, backdrop]);

  const bar = scaleBarLengthM((width * 0.3) / transform.scalePxPerM);

  /** Where a dragged node lands in the view, snapped; `liftPointIndex` names the lift point being dragged. */
  function dragToWorld(node: Konva.Node, liftPointIndex?: number) {
    const world = screenToWorld(transform, node.x(), node.y());
    const snapped = snapViewPoint(world, {
      gridM,
      radiusM: 10 / transform.scalePxPerM,
      candidates,
      enabled: snap,
      draggedIndex: liftPointIndex,
    });
    const screen = S(snapped.a, snapped.b);
    node.position(screen);
    return snapped;
  }

  function onWheel(e: Konva.KonvaEventObject<WheelEvent>) {
    e.evt.preventDefault();
    const pointer = stageRef.current?.getPointerPosition();
    if (!pointer) return;
    setTransform((t) => zoomAbout(t, e.evt.deltaY < 0 ? 1.15 : 1 / 1.15, pointer.x, pointer.y));
  }

  const panStart = useRef<{ x: number; y: number; originX: number; originY: number } | null>(null);

  const hookScreen = hook ? S(P(hook).a, P(hook).b) : null;
  const pointScreens = edit.liftPoints.map((p) => ({ label: p.label, ...S(P(p.position).a, P(p.position).b) }));
  const tilts =
    frame.tilted && hook
      ? planeTilts({ x: hook.x - edit.cog.x, y: hook.y - edit.cog.y, z: hook.z - edit.cog.z })
      : null;
  /** A point dragged to (a, b) of this view, back in the component frame (the hidden axis kept where it hangs). */
  const dropAt = (base: Vec3, a: number, b: number) => frame.toComponent(unproject(frame.toWorld(base), view, a, b));
  const pointLabels = coincidentLabels(pointScreens);
  // The leg figures go in the corner that hides the fewest lines (legs, or the beam's drops and top rigging).
  const figuresSize = { width: Math.min(width - 16, 330), height: legs.length * 17 + 8 };
  const lineSegments: Array<[{ x: number; y: number }, { x: number; y: number }]> = hookScreen
    ? pointScreens.filter((p) => usedLabels.has(p.label)).map((p) => [hookScreen, p])
    : [];
  const figuresAt = placeFiguresBox(figuresSize, { width, height }, lineSegments);

  function handleScreen(handle: Handle) {
    if (handle.kind === "hook") return hookScreen;
    const point = handle.kind === "cog" ? edit.cog : edit.liftPoints.find((p) => p.label === handle.label)?.position;
    if (!point) return null;
    const at = P(point);
    return S(at.a, at.b);
  }

  function onKeyDown(e: React.KeyboardEvent) {
    if (e.ctrlKey || e.metaKey || e.altKey) return;
    if (e.key.startsWith("Arrow")) {
      // Arrows always belong to the drawing while it has focus, so the page does not scroll under a move.
      e.preventDefault();
      const action = selected ? nudgeHandle(edit, selected, view, e.key, { gridM, coarse: e.shiftKey, snap }) : null;
      if (action) dispatch(action);
    } else if (e.key === "+" || e.key === "=" || e.key === "-") {
      // Zoom about the selected handle, so the keyboard can look closely at what it is moving without panning.
      e.preventDefault();
      const about = (selected && handleScreen(selected)) ?? { x: width / 2, y: height / 2 };
      setTransform((t) => zoomAbout(t, e.key === "-" ? 1 / 1.25 : 1.25, about.x, about.y));
    } else if (e.key === "0") {
      e.preventDefault();
      setTransform(fitView(box, width, height));
    } else if (e.key.toLowerCase() === "g") {
      e.preventDefault();
      props.onToggleSnap();
    }
  }

  /** The ring round the selected handle: dashed, and solid and heavier while the drawing has keyboard focus. */
  const ringFor = (handle: Handle, radius: number) =>
    selected && handleKey(selected) === handleKey(handle) ? (
      <Circle
        radius={radius}
        stroke={COLOURS.focus}
        strokeWidth={focused ? 3 : 2}
        dash={focused ? undefined : [4, 3]}
        listening={false}
      />
    ) : null;

  return (
    <div
      tabIndex={0}
      role="application"
      aria-label={props.label}
      aria-describedby={props.describedBy}
      className="group relative focus-visible:outline-none"
      onKeyDown={onKeyDown}
      onFocus={() => setFocused(true)}
      onBlur={() => setFocused(false)}
    >
      <Stage
        ref={stageRef}
        name={`view-${view}`}
        width={width}
        height={height}
        onWheel={onWheel}
        onMouseDown={(e) => {
          const p = stageRef.current?.getPointerPosition();
          if (!p) return;
          // Picking a point on a drawing takes a click anywhere, over the drawing and the load's lines alike.
          if (onPick) {
            const w = screenToWorld(transform, p.x, p.y);
            onPick({ ...w, x: p.x, y: p.y });
            return;
          }
          if (e.target !== e.target.getStage()) return;
          panStart.current = { x: p.x, y: p.y, originX: transform.originX, originY: transform.originY };
        }}
        onMouseMove={() => {
          const start = panStart.current;
          const p = stageRef.current?.getPointerPosition();
          if (!start || !p) return;
          setTransform((t) => ({
            ...t,
            originX: start.originX + p.x - start.x,
            originY: start.originY + p.y - start.y,
          }));
        }}
        onMouseUp={() => (panStart.current = null)}
        onMouseLeave={() => (panStart.current = null)}
        style={{ cursor: onPick ? "crosshair" : "grab" }}
      >
        {paper}
        <Layer listening={false}>
          <Line
            name="load-outline"
            points={outlineShown.flatMap(({ a, b }) => {
              const s = S(a, b);
              return [s.x, s.y];
            })}
            closed
            fill={COLOURS.fill}
            opacity={backdrop ? 0.6 : 1}
            stroke={COLOURS.outline}
            strokeWidth={2}
          />
          {hookScreen && beam === null && (
            <BridleLegs
              edit={edit}
              view={view}
              legs={legs}
              hookScreen={hookScreen}
              usedLabels={usedLabels}
              S={S}
              toWorld={frame.toWorld}
            />
          )}
          {hookScreen && beam?.placement && (
            <BeamDrops edit={edit} view={view} legs={legs} hookScreen={hookScreen} placement={beam.placement} S={S} />
          )}
          {hookScreen && tilts && (
            <Group name="hang-tilt">
              {/* The plumb line: the hook hangs straight above the CoG. */}
              <Line
                points={[
                  hookScreen.x,
                  hookScreen.y,
                  S(P(edit.cog).a, P(edit.cog).b).x,
                  S(P(edit.cog).a, P(edit.cog).b).y,
                ]}
                stroke={COLOURS.ink}
                strokeWidth={1}
                dash={[3, 4]}
              />
              <Text
                x={8}
                y={8}
                text={`As it hangs: ${formatAngle(Math.abs(tilts.alongLengthDeg))} along its length, ${formatAngle(Math.abs(tilts.acrossWidthDeg))} across its width`}
                fontSize={12}
                fontFamily="Barlow, sans-serif"
                fill={COLOURS.ink}
              />
            </Group>
          )}
          {legs.length > 0 && <FiguresBox legs={legs} at={figuresAt} size={figuresSize} />}
          <ScaleBar
            view={view}
            width={width}
            height={height}
            barM={bar}
            scalePxPerM={transform.scalePxPerM}
            units={units}
          />
        </Layer>
        <Layer>
          {edit.liftPoints.map((p, index) => {
            const at = candidates[index]!;
            const s = S(at.a, at.b);
            const used = usedLabels.has(p.label);
            return (
              <Group
                key={p.label}
                name={`lift-point-${p.label}`}
                x={s.x}
                y={s.y}
                draggable={!onPick && !readOnly}
                onPointerDown={() => onSelect({ kind: "lift-point", label: p.label })}
                onDragStart={() => dispatch({ type: "checkpoint" })}
                onDragMove={(e) => {
                  const w = dragToWorld(e.target, index);
                  dispatch({
                    type: "move-lift-point",
                    label: p.label,
                    position: dropAt(p.position, w.a, w.b),
                    transient: true,
                  });
                }}
                onDblClick={() => dispatch({ type: "toggle-lift-point", label: p.label })}
              >
                {ringFor({ kind: "lift-point", label: p.label }, 13)}
                <Circle radius={7} fill={used ? COLOURS.point : "#ffffff"} stroke={COLOURS.point} strokeWidth={2} />
                <Text
                  x={9}
                  y={-20}
                  text={pointLabels.get(p.label) ?? ""}
                  fontSize={14}
                  fontStyle="bold"
                  fontFamily="Barlow, sans-serif"
                  fill={COLOURS.ink}
                />
              </Group>
            );
          })}
          {(() => {
            const at = P(edit.cog);
            const s = S(at.a, at.b);
            return (
              // The CoG is not dragged: it is the component's unless overridden with a reason (the panel).
              <Group x={s.x} y={s.y}>
                {ringFor({ kind: "cog" }, 15)}
                <Circle radius={9} fill="#ffffff" stroke={COLOURS.ink} strokeWidth={2} />
                <Line points={[0, -9, 0, 9]} stroke={COLOURS.ink} strokeWidth={1} />
                <Line points={[-9, 0, 9, 0]} stroke={COLOURS.ink} strokeWidth={1} />
                <Text x={11} y={4} text="CoG" fontSize={12} fontFamily="Barlow, sans-serif" fill={COLOURS.ink} />
              </Group>
            );
          })()}
          {hookScreen && (
            <Group
              x={hookScreen.x}
              y={hookScreen.y}
              draggable={view === "elevation" && level && !onPick && !readOnly}
              dragBoundFunc={(pos) => ({ x: hookScreen.x, y: Math.min(pos.y, height - 4) })}
              onPointerDown={() => level && onSelect({ kind: "hook" })}
              onDragStart={() => dispatch({ type: "checkpoint" })}
              onDragMove={(e) => {
                const w = screenToWorld(transform, e.target.x(), e.target.y());
                const z = snap ? Math.round(w.b / gridM) * gridM : w.b;
                e.target.y(S(0, z).y);
                dispatch({ type: "set-hook-height", hookHeightM: z, transient: true });
              }}
            >
              {ringFor({ kind: "hook" }, 17)}
              <Rect x={-10} y={-14} width={20} height={12} fill={COLOURS.ink} cornerRadius={2} />
              <Circle radius={5} stroke={COLOURS.ink} strokeWidth={2} />
              <Text x={12} y={-16} text="Hook" fontSize={12} fontFamily="Barlow, sans-serif" fill={COLOURS.ink} />
            </Group>
          )}
        </Layer>
      </Stage>
      {/* The focus ring sits on a layer over the canvas: Konva's positioned container would paint over an outline of the drawing itself. */}
      <div
        data-focus-ring
        aria-hidden="true"
        className="pointer-events-none absolute inset-0 group-focus-visible:outline-3 group-focus-visible:-outline-offset-3 group-focus-visible:outline-brass"
      />
      <p className="sr-only" aria-live="polite">
        {focused && selected ? describeHandle(selected, edit, hook, view, units) : ""}
      </p>
    </div>
  );
}
