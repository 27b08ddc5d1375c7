import { formatLength, type Units } from "~/utils/format";

type Point2 = readonly [number, number];
type Vec3 = { x: number; y: number; z: number };

export type ViewData = {
  outlineElevation: ReadonlyArray<Point2>;
  outlinePlan: ReadonlyArray<Point2>;
  cog: Vec3;
  liftPoints: ReadonlyArray<{ label: string; position: Vec3 }>;
};

const SIZE = 260;
const MARGIN = 28;

/** A "nice" scale-bar length (1, 2 or 5 x 10^n metres) near a fifth of the span. */
function scaleBarLength(spanM: number) {
  const target = spanM / 4;
  const power = 10 ** Math.floor(Math.log10(target));
  return [5, 2, 1].map((m) => m * power).find((v) => v <= target) ?? power;
}

function View({
  title,
  outline,
  marks,
  cog,
  axisLabels,
  units,
}: {
  title: string;
  outline: ReadonlyArray<Point2>;
  marks: Array<{ label: string; a: number; b: number }>;
  cog: { a: number; b: number };
  axisLabels: [string, string];
  units: Units;
}) {
  const as = [...outline.map((p) => p[0]), ...marks.map((m) => m.a), cog.a];
  const bs = [...outline.map((p) => p[1]), ...marks.map((m) => m.b), cog.b];
  const minA = Math.min(...as);
  const maxA = Math.max(...as);
  const minB = Math.min(...bs);
  const maxB = Math.max(...bs);
  const span = Math.max(maxA - minA, maxB - minB, 1e-3);
  const scale = (SIZE - 2 * MARGIN) / span;
  const cx = (minA + maxA) / 2;
  const cy = (minB + maxB) / 2;
  const X = (a: number) => SIZE / 2 + (a - cx) * scale;
  const Y = (b: number) => SIZE / 2 - (b - cy) * scale;
  const bar = scaleBarLength(span);
  return (
    <figure className="rounded border border-rule bg-white p-2">
      <svg viewBox={`0 0 ${SIZE} ${SIZE}`} className="h-auto w-full" role="img" aria-label={`${title}, drawn to scale`}>
        <polygon
          points={outline.map((p) => `${X(p[0])},${Y(p[1])}`).join(" ")}
          fill="#dbe8f1"
          stroke="#2f5d7c"
          strokeWidth="1.5"
        />
        {marks.map((m) => (
          <g key={m.label}>
            <circle cx={X(m.a)} cy={Y(m.b)} r="4" fill="#9a6a14" />
            <text x={X(m.a) + 6} y={Y(m.b) - 6} fontSize="11" fill="#17212b">
              {m.label}
            </text>
          </g>
        ))}
        <g aria-label="centre of gravity">
          <circle cx={X(cog.a)} cy={Y(cog.b)} r="7" fill="white" stroke="#17212b" strokeWidth="1.5" />
          <path
            d={`M${X(cog.a)},${Y(cog.b) - 7} A7,7 0 0,1 ${X(cog.a) + 7},${Y(cog.b)} L${X(cog.a)},${Y(cog.b)} Z`}
            fill="#17212b"
          />
          <path
            d={`M${X(cog.a)},${Y(cog.b) + 7} A7,7 0 0,1 ${X(cog.a) - 7},${Y(cog.b)} L${X(cog.a)},${Y(cog.b)} Z`}
            fill="#17212b"
          />
          <text x={X(cog.a) + 9} y={Y(cog.b) + 14} fontSize="11" fill="#17212b">
            CoG
          </text>
        </g>
        <g>
          <line
            x1={MARGIN / 2}
            y1={SIZE - 8}
            x2={MARGIN / 2 + bar * scale}
            y2={SIZE - 8}
            stroke="#17212b"
            strokeWidth="2"
          />
          <text x={MARGIN / 2} y={SIZE - 12} fontSize="10" fill="#3d4a57">
            {formatLength(bar, units)}
          </text>
        </g>
        <text x={SIZE - 4} y={SIZE - 4} fontSize="10" textAnchor="end" fill="#3d4a57">
          {axisLabels[0]} → · {axisLabels[1]} ↑
        </text>
      </svg>
      <figcaption className="mt-1 text-center text-xs text-ink-soft">{title}</figcaption>
    </figure>
  );
}

/** The component's elevation (x, z) and plan (x, y), to scale, with the CoG and the lift points. */
export function ComponentViews({ data, units }: { data: ViewData; units: Units }) {
  return (
    <div className="grid grid-cols-2 gap-3">
      <View
        title="Elevation (looking along y)"
        outline={data.outlineElevation}
        marks={data.liftPoints.map((p) => ({ label: p.label, a: p.position.x, b: p.position.z }))}
        cog={{ a: data.cog.x, b: data.cog.z }}
        axisLabels={["x", "z"]}
        units={units}
      />
      <View
        title="Plan (looking down)"
        outline={data.outlinePlan}
        marks={data.liftPoints.map((p) => ({ label: p.label, a: p.position.x, b: p.position.y }))}
        cog={{ a: data.cog.x, b: data.cog.y }}
        axisLabels={["x", "y"]}
        units={units}
      />
    </div>
  );
}
