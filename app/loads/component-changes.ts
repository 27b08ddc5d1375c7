// What changed between two versions of a component, in words a planner reads before pulling the newer one into a
// plan. Pure and shared with the browser.
import type { ComponentDefinition } from "~/loads/component-definition";

export type ComponentChangeKind =
  | "name"
  | "mass"
  | "mass-source"
  | "contingency"
  | "cog"
  | "cog-source"
  | "dimensions"
  | "outline"
  | "lift-point-added"
  | "lift-point-removed"
  | "lift-point-moved"
  | "lift-point-axis"
  | "lift-point-thread"
  | "parts"
  | "override-removed";

export type ComponentChange = { kind: ComponentChangeKind; message: string };

/** Differences below these are noise from unit conversion, not changes. */
const LENGTH_TOL_M = 5e-4;
const MASS_TOL_KG = 1e-6;

const mm = (m: number) => `${Math.round(m * 1000).toLocaleString("en-GB")} mm`;
const kgText = (kg: number) => `${Number(kg.toFixed(kg < 10 ? 2 : 1)).toLocaleString("en-GB")} kg`;
const point = (p: { x: number; y: number; z: number }) => `(${mm(p.x)}, ${mm(p.y)}, ${mm(p.z)})`;
const dist = (a: { x: number; y: number; z: number }, b: { x: number; y: number; z: number }) =>
  Math.hypot(a.x - b.x, a.y - b.y, a.z - b.z);

function samePolygon(a: ReadonlyArray<readonly [number, number]>, b: ReadonlyArray<readonly [number, number]>) {
  return (
    a.length === b.length &&
    a.every((p, i) => Math.abs(p[0] - b[i]![0]) <= LENGTH_TOL_M && Math.abs(p[1] - b[i]![1]) <= LENGTH_TOL_M)
  );
}

/** What changed from component definition `before` to `after`, in plain sentences (SI: mm, kg). Empty when nothing that matters changed. */
export function diffComponentDefinitions(before: ComponentDefinition, after: ComponentDefinition): ComponentChange[] {
  const changes: ComponentChange[] = [];
  if (before.name !== after.name)
    changes.push({ kind: "name", message: `Renamed from "${before.name}" to "${after.name}".` });
  if (Math.abs(before.massKg - after.massKg) > MASS_TOL_KG) {
    changes.push({ kind: "mass", message: `Mass ${kgText(before.massKg)} → ${kgText(after.massKg)}.` });
  }
  if (before.massSource !== after.massSource)
    changes.push({ kind: "mass-source", message: `Mass source ${before.massSource} → ${after.massSource}.` });
  if (before.contingencyPct !== after.contingencyPct) {
    changes.push({
      kind: "contingency",
      message: `Contingency ${before.contingencyPct} % → ${after.contingencyPct} %.`,
    });
  }
  const cogMove = dist(before.cog, after.cog);
  if (cogMove > LENGTH_TOL_M) {
    changes.push({ kind: "cog", message: `CoG moved ${mm(cogMove)}: ${point(before.cog)} → ${point(after.cog)}.` });
  }
  if (before.cogSource !== after.cogSource)
    changes.push({ kind: "cog-source", message: `CoG source ${before.cogSource} → ${after.cogSource}.` });
  const dims = (d: ComponentDefinition) => [d.lengthM, d.widthM, d.heightM] as const;
  if (dims(before).some((v, i) => Math.abs(v - dims(after)[i]!) > LENGTH_TOL_M)) {
    const f = (d: ComponentDefinition) => dims(d).map(mm).join(" × ");
    changes.push({ kind: "dimensions", message: `Overall size ${f(before)} → ${f(after)}.` });
  }
  if (
    !samePolygon(before.outlineElevation, after.outlineElevation) ||
    !samePolygon(before.outlinePlan, after.outlinePlan)
  ) {
    changes.push({ kind: "outline", message: "The outline drawing changed." });
  }
  const beforePoints = new Map(before.liftPoints.map((p) => [p.label, p]));
  const afterPoints = new Map(after.liftPoints.map((p) => [p.label, p]));
  for (const [label, p] of afterPoints) {
    const old = beforePoints.get(label);
    if (!old) {
      changes.push({ kind: "lift-point-added", message: `Lift point ${label} added at ${point(p.position)}.` });
      continue;
    }
    const moved = dist(old.position, p.position);
    if (moved > LENGTH_TOL_M) {
      changes.push({
        kind: "lift-point-moved",
        message: `Lift point ${label} moved ${mm(moved)}: ${point(old.position)} → ${point(p.position)}.`,
      });
    }
    if (dist(old.axis, p.axis) > 1e-6)
      changes.push({ kind: "lift-point-axis", message: `Lift point ${label}'s axis changed.` });
    if (old.thread !== p.thread) {
      changes.push({
        kind: "lift-point-thread",
        message: `Lift point ${label}'s thread ${old.thread || "none"} → ${p.thread || "none"}.`,
      });
    }
  }
  for (const label of beforePoints.keys()) {
    if (!afterPoints.has(label)) changes.push({ kind: "lift-point-removed", message: `Lift point ${label} removed.` });
  }
  const partsKey = (d: ComponentDefinition) => JSON.stringify(d.parts);
  if (partsKey(before) !== partsKey(after)) changes.push({ kind: "parts", message: "The composite parts changed." });
  return changes;
}
