import { Group, Line, Text } from "react-konva";
import { COLOURS } from "~/components/plan-canvas/colours";
import type { DrawingView } from "~/plans/editor-state";
import { formatLength, type Units } from "~/utils/format";

/** The scale bar (barM long at scalePxPerM) in the lower left and the view's axes in the lower right. */
export function ScaleBar({
  view,
  width,
  height,
  barM,
  scalePxPerM,
  units,
}: {
  view: DrawingView;
  width: number;
  height: number;
  barM: number;
  scalePxPerM: number;
  units: Units;
}) {
  return (
    <Group>
      <Line points={[16, height - 16, 16 + barM * scalePxPerM, height - 16]} stroke={COLOURS.ink} strokeWidth={3} />
      <Text
        x={16}
        y={height - 34}
        text={formatLength(barM, units)}
        fontSize={12}
        fontFamily="Barlow, sans-serif"
        fill={COLOURS.ink}
      />
      <Text
        x={width - 120}
        y={height - 22}
        width={110}
        align="right"
        text={view === "elevation" ? "x →   z ↑" : "x →   y ↑"}
        fontSize={12}
        fontFamily="Barlow, sans-serif"
        fill={COLOURS.none}
      />
    </Group>
  );
}
