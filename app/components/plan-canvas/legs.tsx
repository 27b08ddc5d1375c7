// The rigging drawn between the hook and the used lift points: straight legs to one hook, or a lifting beam
// with vertical drops. Each leg or drop takes the colour of its worst check.
import { Group, Line } from "react-konva";
import type { LegFigure } from "~/components/plan-canvas.client";
import { COLOURS } from "~/components/plan-canvas/colours";
import { project } from "~/components/plan-canvas/projection";
import type { DrawingView, PlanEdit, Vec3 } from "~/plans/editor-state";

type ScreenPoint = { x: number; y: number };
type ToScreen = (a: number, b: number) => ScreenPoint;

/** Legs from the hook to each used lift point; a failing leg is heavier, a slack one dashed. */
export function BridleLegs({
  edit,
  view,
  legs,
  hookScreen,
  usedLabels,
  S,
  toWorld = (p) => p,
}: {
  edit: PlanEdit;
  view: DrawingView;
  legs: LegFigure[];
  hookScreen: ScreenPoint;
  usedLabels: ReadonlySet<string>;
  S: ToScreen;
  /** Where a component-frame point hangs (the drawing turned to the load's tilt). */
  toWorld?: (p: Vec3) => Vec3;
}) {
  return edit.liftPoints
    .filter((p) => usedLabels.has(p.label))
    .map((p) => {
      const at = project(toWorld(p.position), view);
      const s = S(at.a, at.b);
      const figure = legs.find((l) => l.label === p.label);
      const colour = COLOURS[figure?.tone ?? "none"];
      return (
        <Line
          key={`leg-${p.label}`}
          points={[hookScreen.x, hookScreen.y, s.x, s.y]}
          stroke={colour}
          strokeWidth={figure?.tone === "fail" ? 4 : 3}
          dash={figure?.slack ? [8, 6] : undefined}
        />
      );
    });
}

/** A lifting beam at beamZM: its lug over the CoG, a vertical drop to each used lift point. */
export function BeamDrops({
  edit,
  view,
  legs,
  hookScreen,
  usedLabels,
  beamZM,
  S,
}: {
  edit: PlanEdit;
  view: DrawingView;
  legs: LegFigure[];
  hookScreen: ScreenPoint;
  usedLabels: ReadonlySet<string>;
  beamZM: number;
  S: ToScreen;
}) {
  const used = edit.liftPoints.filter((p) => usedLabels.has(p.label));
  const lug = project({ x: edit.cog.x, y: edit.cog.y, z: beamZM }, view);
  const lugScreen = S(lug.a, lug.b);
  const ends = used.map((p) => project({ ...p.position, z: beamZM }, view));
  const as = ends.map((e) => e.a);
  const beamStart =
    view === "elevation" ? S(Math.min(...as, lug.a), lug.b) : S(ends[0]?.a ?? lug.a, ends[0]?.b ?? lug.b);
  const beamEnd =
    view === "elevation" ? S(Math.max(...as, lug.a), lug.b) : S(ends.at(-1)?.a ?? lug.a, ends.at(-1)?.b ?? lug.b);
  return (
    <Group>
      {used.map((p) => {
        const figure = legs.find((l) => l.label === p.label);
        const bottom = S(project(p.position, view).a, project(p.position, view).b);
        const top = S(project({ ...p.position, z: beamZM }, view).a, project({ ...p.position, z: beamZM }, view).b);
        return (
          <Line
            key={`drop-${p.label}`}
            points={[top.x, top.y, bottom.x, bottom.y]}
            stroke={COLOURS[figure?.tone ?? "none"]}
            strokeWidth={3}
          />
        );
      })}
      <Line
        points={[beamStart.x, beamStart.y, beamEnd.x, beamEnd.y]}
        stroke={COLOURS.ink}
        strokeWidth={8}
        lineCap="round"
      />
      <Line points={[hookScreen.x, hookScreen.y, lugScreen.x, lugScreen.y]} stroke={COLOURS.ink} strokeWidth={3} />
    </Group>
  );
}
