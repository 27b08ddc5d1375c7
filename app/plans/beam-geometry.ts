// Where a plan's beam hangs, for the server's solve and for both drawings: a register beam placed by its
// lugs over the lift points; a beam typed on a plan made before, as those plans were always solved. Pure.
import { placeBeam, type BeamGeometry, type BeamPlacement, type PlacementOutcome } from "~/statics/beam-placement";
import type { Vec3 } from "~/statics/vector";
import type { PlanEdit } from "~/plans/editor-state";
import type { GearPick } from "~/plans/rigging";

/** The register beam's geometry, or only the typed length of a beam not from the register. */
export function placeBeamForPlan(
  points: ReadonlyArray<{ id: string; position: Vec3 }>,
  cog: Vec3,
  dropLengthM: number,
  beam: BeamGeometry | { lengthM: number },
): PlacementOutcome {
  if ("dropLugsM" in beam) {
    const geometry = { ...beam, dropLugsM: [...beam.dropLugsM].sort((a, b) => a - b) };
    return placeBeam(geometry, points, dropLengthM);
  }
  const typed = typedBeamPlacement(points, cog, beam.lengthM, dropLengthM);
  return typed
    ? { ok: true, placement: typed }
    : {
        ok: false,
        code: "DEGENERATE_LIFT_POINTS",
        message: "A beam carries the load on at least two drops, apart in plan.",
      };
}

/**
 * A plan without a register beam (typed figures): the beam along the line of the lift points, centred on
 * them, its lug over the load's CoG as an adjustable lifting beam; drops drawn from above each point.
 */
function typedBeamPlacement(
  points: ReadonlyArray<{ id: string; position: Vec3 }>,
  cog: Vec3,
  lengthM: number,
  dropLengthM: number,
): BeamPlacement | null {
  if (points.length < 2) return null;
  let best = -1;
  let a = points[0]!.position;
  let b = points[1]!.position;
  for (const p of points)
    for (const q of points) {
      const d = Math.hypot(p.position.x - q.position.x, p.position.y - q.position.y);
      if (d > best) [best, a, b] = [d, p.position, q.position];
    }
  if (!(best > 1e-6)) return null;
  const ex = (b.x - a.x) / best;
  const ey = (b.y - a.y) / best;
  const ts = points.map((p) => (p.position.x - a.x) * ex + (p.position.y - a.y) * ey);
  const start = Math.min(...ts) - (lengthM - (Math.max(...ts) - Math.min(...ts))) / 2;
  const beamZM = Math.max(...points.map((p) => p.position.z)) + dropLengthM;
  const at = (t: number): Vec3 => ({ x: a.x + t * ex, y: a.y + t * ey, z: beamZM });
  // As these plans were always solved: each drop hangs plumb from above its lift point.
  const drops = points.map((p, i) => ({
    liftPointId: p.id,
    lugIndex: i,
    lug: { x: p.position.x, y: p.position.y, z: beamZM },
    lengthM: beamZM - p.position.z,
    angleFromVerticalDeg: 0,
  }));
  const lug = { x: cog.x, y: cog.y, z: beamZM };
  return {
    axis: { x: ex, y: ey, z: 0 },
    endA: at(start),
    endB: at(start + lengthM),
    drops,
    topLugs: [lug],
    cog: lug,
    beamZM,
  };
}

/**
 * The editor's beam as it would hang now: null for a bridle; for a beam arrangement the placement, or the
 * reason it cannot be placed (no beam allocated, lugs that do not fit the lift points).
 */
export function editorBeamPlacement(
  edit: Pick<PlanEdit, "arrangement" | "rigging" | "liftPoints" | "cog">,
  picks: ReadonlyMap<number, GearPick>,
): { placement: BeamPlacement | null; problem: string | null } | null {
  const a = edit.arrangement;
  if (a.kind !== "beam" || !a.beam) return null;
  const pick = edit.rigging.beamItemId !== undefined ? picks.get(edit.rigging.beamItemId) : undefined;
  const geometry = pick?.spec.role === "beam" ? pick.spec.beam : null;
  const points = edit.liftPoints
    .filter((p) => a.liftPointLabels.includes(p.label))
    .map((p) => ({ id: p.label, position: p.position }));
  const beam = geometry ?? (a.beam.lengthM !== undefined && !pick ? { lengthM: a.beam.lengthM } : null);
  if (!beam)
    return {
      placement: null,
      problem: pick
        ? `${pick.itemCode} has no lug positions in the register.`
        : "Allocate the lifting beam or spreader from the register (Gear).",
    };
  const placed = placeBeamForPlan(points, edit.cog, a.beam.dropLengthM, beam);
  return placed.ok ? { placement: placed.placement, problem: null } : { placement: null, problem: placed.message };
}
