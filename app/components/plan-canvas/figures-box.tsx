import { Group, Rect, Text } from "react-konva";
import type { LegFigure } from "~/components/plan-canvas.client";
import { COLOURS } from "~/components/plan-canvas/colours";

/** Each leg's figures in a box at `at`, written in the colour of the leg's worst check. */
export function FiguresBox({
  legs,
  at,
  size,
}: {
  legs: LegFigure[];
  at: { x: number; y: number };
  size: { width: number; height: number };
}) {
  return (
    <Group x={at.x} y={at.y} name="leg-figures">
      <Rect width={size.width} height={size.height} fill="#ffffff" opacity={0.85} cornerRadius={3} />
      {legs.map((leg, i) => (
        <Text
          key={leg.label}
          x={6}
          y={5 + i * 17}
          text={`${leg.text}${leg.slack ? " (slack)" : ""}`}
          fontSize={12}
          fontStyle="bold"
          fontFamily="Barlow, sans-serif"
          fill={COLOURS[leg.tone]}
        />
      ))}
    </Group>
  );
}
