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
import { formatLength, type Units } from "~/utils/format";

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

/** One view of the plan, drawn to scale; lift points, CoG and (in elevation, level mode) the hook can be dragged. */
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
    selected,
    onSelect,
  } = props;
  const stageRef = useRef<Konva.Stage>(null);
  const [focused, setFocused] = useState(false);

  const box = useMemo(() => {
    const pts = [
      ...outline.map(([a, b]) => ({ a, b })),
      ...edit.liftPoints.map((p) => project(p.position, view)),
      project(edit.cog, view),
    ];
    if (hook) pts.push(project(hook, view));
    const as = pts.map((p) => p.a);
    const bs = pts.map((p) => p.b);
    return { minA: Math.min(...as), maxA: Math.max(...as), minB: Math.min(...bs), maxB: Math.max(...bs) };
    // Fit once per load and view size, not on every drag.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [outline, view, width, height]);
  const [transform, setTransform] = useState<ViewTransform>(() => fitView(box, width, height));
  // Refit when the load or the view's size changes: adjusted while rendering, not in an effect.
  const [fittedFor, setFittedFor] = useState({ box, width, height });
  if (fittedFor.box !== box || fittedFor.width !== width || fittedFor.height !== height) {
    setFittedFor({ box, width, height });
    setTransform(fitView(box, width, height));
  }

  const S = (a: number, b: number) => worldToScreen(transform, a, b);
  const usedLabels = new Set(edit.arrangement.liftPointLabels);
  const candidates = edit.liftPoints.map((p) => project(p.position, view));

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

  const bar = scaleBarLengthM((width * 0.3) / transform.scalePxPerM);

  function dragToWorld(node: Konva.Node, exclude?: { a: number; b: number }) {
    const world = screenToWorld(transform, node.x(), node.y());
    const snapped = snapViewPoint(world, {
      gridM,
      radiusM: 10 / transform.scalePxPerM,
      candidates: exclude ? candidates.filter((c) => c !== exclude) : candidates,
      enabled: snap,
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

  const hookScreen = hook ? S(project(hook, view).a, project(hook, view).b) : null;
  const pointScreens = edit.liftPoints.map((p) => ({
    label: p.label,
    ...S(project(p.position, view).a, project(p.position, view).b),
  }));
  const pointLabels = coincidentLabels(pointScreens);
  // The leg figures go in the corner that hides the fewest lines (legs, or the beam's drops and top rigging).
  const figuresSize = { width: Math.min(width - 16, 250), height: legs.length * 17 + 8 };
  const lineSegments: Array<[{ x: number; y: number }, { x: number; y: number }]> = hookScreen
    ? pointScreens.filter((p) => usedLabels.has(p.label)).map((p) => [hookScreen, p])
    : [];
  const figuresAt = placeFiguresBox(figuresSize, { width, height }, lineSegments);
  const level = edit.arrangement.mode === "level";

  function handleScreen(handle: Handle) {
    if (handle.kind === "hook") return hookScreen;
    const point = handle.kind === "cog" ? edit.cog : edit.liftPoints.find((p) => p.label === handle.label)?.position;
    if (!point) return null;
    const at = project(point, view);
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
          <Line
            points={outline.flatMap(([a, b]) => {
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
            <BridleLegs edit={edit} view={view} legs={legs} hookScreen={hookScreen} usedLabels={usedLabels} S={S} />
          )}
          {hookScreen && beam?.placement && (
            <BeamDrops edit={edit} view={view} legs={legs} hookScreen={hookScreen} placement={beam.placement} S={S} />
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
          {edit.liftPoints.map((p) => {
            const at = project(p.position, view);
            const s = S(at.a, at.b);
            const used = usedLabels.has(p.label);
            return (
              <Group
                key={p.label}
                name={`lift-point-${p.label}`}
                x={s.x}
                y={s.y}
                draggable={!onPick}
                onPointerDown={() => onSelect({ kind: "lift-point", label: p.label })}
                onDragStart={() => dispatch({ type: "checkpoint" })}
                onDragMove={(e) => {
                  const w = dragToWorld(e.target, at);
                  dispatch({
                    type: "move-lift-point",
                    label: p.label,
                    position: unproject(p.position, view, w.a, w.b),
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
            const at = project(edit.cog, view);
            const s = S(at.a, at.b);
            return (
              <Group
                x={s.x}
                y={s.y}
                draggable={!onPick}
                onPointerDown={() => onSelect({ kind: "cog" })}
                onDragStart={() => dispatch({ type: "checkpoint" })}
                onDragMove={(e) => {
                  const w = dragToWorld(e.target);
                  dispatch({ type: "move-cog", cog: unproject(edit.cog, view, w.a, w.b), transient: true });
                }}
              >
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
              draggable={view === "elevation" && level && !onPick}
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
