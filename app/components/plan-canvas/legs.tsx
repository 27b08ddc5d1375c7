// The rigging drawn between the hook and the used lift points: straight legs to one hook, or a beam placed
// true with its drops and top rigging. Each leg or drop takes the colour of its worst check.
import { Circle, Group, Line } from "react-konva";
import type { LegFigure } from "~/components/plan-canvas.client";
import { COLOURS } from "~/components/plan-canvas/colours";
import { project } from "~/components/plan-canvas/projection";
import type { DrawingView, PlanEdit, Vec3 } from "~/plans/editor-state";
import type { BeamPlacement } from "~/statics/beam-placement";

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

/**
 * The beam drawn true: along its axis at its length and height, a drop from each of its drop lugs to the lift
 * point it carries, the top rigging from the hook to its top lug(s). In the view along its axis the beam is
 * seen end on, as it is.
 */
export function BeamDrops({
  edit,
  view,
  legs,
  hookScreen,
  placement,
  S,
}: {
  edit: PlanEdit;
  view: DrawingView;
  legs: LegFigure[];
  hookScreen: ScreenPoint;
  placement: BeamPlacement;
  S: ToScreen;
}) {
  const at = (p: { x: number; y: number; z: number }) => {
    const v = project(p, view);
    return S(v.a, v.b);
  };
  const endA = at(placement.endA);
  const endB = at(placement.endB);
  return (
    <Group>
      {placement.drops.map((d) => {
        const point = edit.liftPoints.find((p) => p.label === d.liftPointId);
        if (!point) return null;
        const figure = legs.find((l) => l.label === d.liftPointId);
        const top = at(d.lug);
        const bottom = at(point.position);
        return (
          <Line
            key={`drop-${d.liftPointId}`}
            points={[top.x, top.y, bottom.x, bottom.y]}
            stroke={COLOURS[figure?.tone ?? "none"]}
            strokeWidth={figure?.tone === "fail" ? 4 : 3}
            dash={figure?.slack ? [8, 6] : undefined}
          />
        );
      })}
      <Line points={[endA.x, endA.y, endB.x, endB.y]} stroke={COLOURS.ink} strokeWidth={8} lineCap="round" />
      {placement.topLugs.map((lug, i) => {
        const s = at(lug);
        return (
          <Line key={`top-${i}`} points={[hookScreen.x, hookScreen.y, s.x, s.y]} stroke={COLOURS.ink} strokeWidth={3} />
        );
      })}
      {[...placement.drops.map((d) => d.lug), ...placement.topLugs].map((lug, i) => {
        const s = at(lug);
        return (
          <Circle
            key={`lug-${i}`}
            x={s.x}
            y={s.y}
            radius={3}
            fill={COLOURS.fill}
            stroke={COLOURS.ink}
            strokeWidth={1.5}
          />
        );
      })}
    </Group>
  );
}
