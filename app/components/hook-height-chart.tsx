import { useMemo } from "react";
import { solveLevel, type LiftPoint } from "~/statics/bridle";
import { formatLength, massUnitLabel, toDisplayMass, type Units } from "~/utils/format";

const W = 640;
const H = 220;
const PAD = { left: 56, right: 56, top: 16, bottom: 34 };

/**
 * The largest leg tension and the largest sling angle against hook height, from the statics core,
 * with the 45 and 60 deg limits and the current setting: longer slings lower the loads.
 */
export function HookHeightChart({
  massKg,
  cog,
  points,
  currentHookZM,
  units,
}: {
  massKg: number;
  cog: { x: number; y: number; z: number };
  points: LiftPoint[];
  currentHookZM: number;
  units: Units;
}) {
  const series = useMemo(() => {
    if (points.length === 0) return [];
    const zTop = Math.max(...points.map((p) => p.position.z));
    const reach = Math.max(0.05, ...points.map((p) => Math.hypot(p.position.x - cog.x, p.position.y - cog.y)));
    const from = zTop + reach * 0.2;
    const to = zTop + reach * 4;
    const out: Array<{ z: number; tensionKg: number; angleDeg: number }> = [];
    for (let i = 0; i <= 80; i++) {
      const z = from + ((to - from) * i) / 80;
      const r = solveLevel({ massKg, cog }, points, z);
      if (!r.ok) continue;
      out.push({
        z,
        tensionKg: Math.max(...r.solution.legs.map((l) => l.tensionKg)),
        angleDeg: Math.max(...r.solution.legs.map((l) => l.angleFromVerticalDeg)),
      });
    }
    return out;
  }, [massKg, cog, points]);

  if (series.length < 2) {
    return (
      <section className="rounded border border-rule bg-card p-4">
        <h2 className="text-lg">Hook height</h2>
        <p className="text-sm text-ink-soft">The chart needs a layout that can hang level.</p>
      </section>
    );
  }
  const zMin = series[0]!.z;
  const zMax = series.at(-1)!.z;
  const tMax = Math.max(...series.map((s) => s.tensionKg)) * 1.05;
  const X = (z: number) => PAD.left + ((z - zMin) / (zMax - zMin)) * (W - PAD.left - PAD.right);
  const YT = (t: number) => H - PAD.bottom - (t / tMax) * (H - PAD.top - PAD.bottom);
  const YA = (a: number) => H - PAD.bottom - (a / 90) * (H - PAD.top - PAD.bottom);
  const path = (f: (s: (typeof series)[number]) => number) =>
    series.map((s, i) => `${i ? "L" : "M"}${X(s.z).toFixed(1)},${f(s).toFixed(1)}`).join(" ");
  const current = Math.min(Math.max(currentHookZM, zMin), zMax);
  return (
    <section className="rounded border border-rule bg-card p-4" aria-labelledby="hook-chart-heading">
      <h2 id="hook-chart-heading" className="text-lg">
        Hook height: leg tension and sling angle
      </h2>
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="mt-2 h-auto w-full"
        role="img"
        aria-label="Largest leg tension and largest sling angle against hook height"
      >
        <line x1={PAD.left} y1={YA(45)} x2={W - PAD.right} y2={YA(45)} stroke="#9a5b00" strokeDasharray="4 4" />
        <text x={W - PAD.right - 4} y={YA(45) - 4} textAnchor="end" fontSize="11" fill="#9a5b00">
          45° warn
        </text>
        <line x1={PAD.left} y1={YA(60)} x2={W - PAD.right} y2={YA(60)} stroke="#a8261d" strokeDasharray="4 4" />
        <text x={W - PAD.right - 4} y={YA(60) - 4} textAnchor="end" fontSize="11" fill="#a8261d">
          60° limit
        </text>
        <path d={path((s) => YT(s.tensionKg))} fill="none" stroke="#2f5d7c" strokeWidth="2.5" />
        <path d={path((s) => YA(s.angleDeg))} fill="none" stroke="#9a6a14" strokeWidth="2" strokeDasharray="6 3" />
        <line x1={X(current)} y1={PAD.top} x2={X(current)} y2={H - PAD.bottom} stroke="#17212b" strokeWidth="1.5" />
        <text x={X(current) + 4} y={PAD.top + 10} fontSize="11" fill="#17212b">
          now {formatLength(currentHookZM, units)}
        </text>
        <line x1={PAD.left} y1={H - PAD.bottom} x2={W - PAD.right} y2={H - PAD.bottom} stroke="#3d4a57" />
        {[0, 0.5, 1].map((f) => {
          const z = zMin + (zMax - zMin) * f;
          return (
            <text key={f} x={X(z)} y={H - PAD.bottom + 14} fontSize="11" textAnchor="middle" fill="#3d4a57">
              {formatLength(z, units)}
            </text>
          );
        })}
        <text x={(PAD.left + W - PAD.right) / 2} y={H - 4} fontSize="11" textAnchor="middle" fill="#3d4a57">
          hook height z in the component frame
        </text>
        {[0, 0.5, 1].map((f) => (
          <text key={f} x={PAD.left - 6} y={YT(tMax * f) + 4} fontSize="11" textAnchor="end" fill="#2f5d7c">
            {Math.round(toDisplayMass(tMax * f, units)).toLocaleString("en-GB")}
          </text>
        ))}
        <text x={8} y={PAD.top + 4} fontSize="11" fill="#2f5d7c">
          {massUnitLabel(units)}
        </text>
        {[0, 45, 90].map((a) => (
          <text key={a} x={W - PAD.right + 6} y={YA(a) + 4} fontSize="11" fill="#9a6a14">
            {a}°
          </text>
        ))}
      </svg>
      <p className="text-xs text-ink-soft">
        <span className="font-semibold text-steel">Solid: largest leg tension ({massUnitLabel(units)})</span> ·{" "}
        <span className="font-semibold text-brass">dashed: largest angle from vertical</span>. Each point is a
        level-mode solve of this layout.
      </p>
    </section>
  );
}
