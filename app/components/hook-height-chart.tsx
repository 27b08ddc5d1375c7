import { useMemo } from "react";
import { hookSweep, passesFrom, type SweepItem } from "~/plans/hook-sweep";
import type { LiftPoint } from "~/statics/bridle";
import type { RiggingDescription } from "~/statics/check-types";
import type { ReferenceTables, RuleSetId } from "~/statics/reference";
import { formatLength, formatLengthUp, massUnitLabel, toDisplayMass, type Units } from "~/utils/format";

const W = 640;
const H = 220;
const PAD = { left: 56, right: 56, top: 16, bottom: 34 };

/** Capacity lines by kind of item. */
const ITEM_COLOURS: Partial<Record<SweepItem["kind"], string>> = {
  eyebolt: "#7a3e9d",
  "sling-leg": "#1f7a4d",
  shackle: "#b0451a",
};

/**
 * The design load the checks use (the largest leg's design tension with contingency, not the elastic share)
 * and each allocated item's capacity against hook height, from the statics core and the plan's own checks
 * (an eyebolt derated for its angle, a sling leg by its hitch), with the largest sling angle and its 45 and
 * 60 deg limits, the current setting, and the height from which each check passes.
 */
export function HookHeightChart({
  massKg,
  cog,
  points,
  rigging,
  tables,
  ruleSet,
  currentHookZM,
  units,
}: {
  massKg: number;
  cog: { x: number; y: number; z: number };
  points: Array<LiftPoint & { thread?: string }>;
  rigging?: RiggingDescription;
  tables?: ReferenceTables | null;
  ruleSet?: RuleSetId;
  currentHookZM: number;
  units: Units;
}) {
  const sweep = useMemo(() => {
    if (points.length === 0) return { points: [], items: [] };
    const zTop = Math.max(...points.map((p) => p.position.z));
    const reach = Math.max(0.05, ...points.map((p) => Math.hypot(p.position.x - cog.x, p.position.y - cog.y)));
    return hookSweep({ massKg, cog, points, rigging, tables, ruleSet }, zTop + reach * 0.2, zTop + reach * 4, 80);
  }, [massKg, cog, points, rigging, tables, ruleSet]);
  const series = sweep.points.map((p) => ({ z: p.hookZM, tensionKg: p.designLoadKg, angleDeg: p.maxAngleDeg }));

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
  const loadMax = Math.max(...series.map((s) => s.tensionKg));
  const capacities = sweep.points.flatMap((p) => Object.values(p.items).map((i) => i.capacityKg));
  // Capacities far above the load would flatten it: the axis stops at three times the largest load.
  const tMax = Math.min(Math.max(loadMax, ...capacities), loadMax * 3) * 1.05;
  const capacityPath = (id: string) =>
    sweep.points
      .filter((p) => p.items[id])
      .map(
        (p, i) => `${i ? "L" : "M"}${X(p.hookZM).toFixed(1)},${YT(Math.min(p.items[id]!.capacityKg, tMax)).toFixed(1)}`,
      )
      .join(" ");
  const last = sweep.points.at(-1);
  const X = (z: number) => PAD.left + ((z - zMin) / (zMax - zMin)) * (W - PAD.left - PAD.right);
  const YT = (t: number) => H - PAD.bottom - (t / tMax) * (H - PAD.top - PAD.bottom);
  const YA = (a: number) => H - PAD.bottom - (a / 90) * (H - PAD.top - PAD.bottom);
  const path = (f: (s: (typeof series)[number]) => number) =>
    series.map((s, i) => `${i ? "L" : "M"}${X(s.z).toFixed(1)},${f(s).toFixed(1)}`).join(" ");
  const current = Math.min(Math.max(currentHookZM, zMin), zMax);
  return (
    <section className="rounded border border-rule bg-card p-4" aria-labelledby="hook-chart-heading">
      <h2 id="hook-chart-heading" className="text-lg">
        Hook height: design load, capacities and sling angle
      </h2>
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="mt-2 h-auto w-full"
        role="img"
        aria-label="Largest leg design load, each item's capacity and the largest sling angle against hook height"
      >
        <line x1={PAD.left} y1={YA(45)} x2={W - PAD.right} y2={YA(45)} stroke="#9a5b00" strokeDasharray="4 4" />
        <text x={W - PAD.right - 4} y={YA(45) - 4} textAnchor="end" fontSize="11" fill="#9a5b00">
          45° warn
        </text>
        <line x1={PAD.left} y1={YA(60)} x2={W - PAD.right} y2={YA(60)} stroke="#a8261d" strokeDasharray="4 4" />
        <text x={W - PAD.right - 4} y={YA(60) - 4} textAnchor="end" fontSize="11" fill="#a8261d">
          60° limit
        </text>
        {sweep.items.map((item) => (
          <g key={item.id} data-testid={`capacity-${item.id}`}>
            <path
              d={capacityPath(item.id)}
              fill="none"
              stroke={ITEM_COLOURS[item.kind] ?? "#3d4a57"}
              strokeWidth="1.5"
              strokeDasharray="2 2"
            />
            {last?.items[item.id] && (
              <text
                x={W - PAD.right - 4}
                y={YT(Math.min(last.items[item.id]!.capacityKg, tMax)) - 3}
                textAnchor="end"
                fontSize="10"
                fill={ITEM_COLOURS[item.kind] ?? "#3d4a57"}
              >
                {item.item.replace(/ \(.*\)$/, "")}
              </text>
            )}
          </g>
        ))}
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
        <span className="font-semibold text-steel">
          Solid: largest leg design load with contingency ({massUnitLabel(units)}), the figure the checks use
        </span>{" "}
        · <span className="font-semibold text-brass">dashed: largest angle from vertical</span> · dotted: each allocated
        item&apos;s capacity at that height (an eyebolt derated for its angle, a sling leg by its hitch). Each point is
        a level-mode solve of this layout with the plan&apos;s checks.
      </p>
      {sweep.items.length > 0 && (
        <ul className="mt-1 text-xs" data-testid="passes-from">
          {sweep.items.map((item) => {
            const from = passesFrom(sweep.points, item.id);
            return (
              <li key={item.id}>
                {item.item}:{" "}
                {from === null
                  ? "does not pass at any hook height shown: change the item or the rigging"
                  : from <= zMin
                    ? "passes at every hook height shown"
                    : `passes with the hook at ${formatLengthUp(from, units)} or higher`}
              </li>
            );
          })}
        </ul>
      )}
    </section>
  );
}
