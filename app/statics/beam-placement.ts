// Where a straight beam hangs over the load: its axis through the lift points, each drop lug above its
// lift point, the beam level at the drops' top. Pure: the beam's geometry comes in as numbers.
import type { Vec3 } from "./vector";

/** A beam as the register records it: length, lugs along it from end A (m), its own mass (kg). */
export interface BeamGeometry {
  lengthM: number;
  /** Drop lug positions, m from end A, 0..lengthM. */
  dropLugsM: readonly number[];
  /** Top lug positions, m from end A: one for a lifting beam, two for a spreader. */
  topLugsM: readonly number[];
}

/** The beam placed in the component frame (m): its ends, lugs and CoG at the beam's height. */
export interface BeamPlacement {
  /** Unit vector along the beam, end A to end B, horizontal. */
  axis: Vec3;
  endA: Vec3;
  endB: Vec3;
  /** Per lift point (in the order given): the lug its drop hangs from. */
  drops: Array<{ liftPointId: string; lugIndex: number; lug: Vec3; lengthM: number; angleFromVerticalDeg: number }>;
  topLugs: Vec3[];
  /** Mid-length: a beam of uniform section (common practice where the register has no CoG). */
  cog: Vec3;
  beamZM: number;
}

export type PlacementOutcome = { ok: true; placement: BeamPlacement } | { ok: false; code: string; message: string };

/** A drop within this of plumb counts as vertical (STATICS.md angle limits: beta <= 5 deg; common practice). */
export const DROP_VERTICAL_LIMIT_DEG = 5;

const mm = (m: number) => `${Math.round(m * 1000).toLocaleString("en-GB")} mm`;

/**
 * Places the beam over the lift points: drop i hangs from lug `lugIndex[i]` (default: lugs and lift points
 * paired in order along the line of the points, when their counts match). The axis runs from the point on the
 * lowest-numbered lug to the point on the highest; end A is set by least squares so each lug is as near as it
 * can be above its point. The beam hangs dropLengthM above the highest lift point. Refused when a drop would
 * lean more than DROP_VERTICAL_LIMIT_DEG, or the pairing cannot be made.
 */
export function placeBeam(
  beam: BeamGeometry,
  points: ReadonlyArray<{ id: string; position: Vec3 }>,
  dropLengthM: number,
  lugIndex?: readonly number[],
): PlacementOutcome {
  if (points.length < 2)
    return { ok: false, code: "BEAM_NEEDS_TWO_DROPS", message: "A beam carries the load on at least two drops." };
  let pairing: number[];
  if (lugIndex) {
    pairing = [...lugIndex];
  } else {
    if (beam.dropLugsM.length !== points.length)
      return {
        ok: false,
        code: "BEAM_LUGS_UNPAIRED",
        message: `The beam has ${beam.dropLugsM.length} drop lugs for ${points.length} lift points: use a beam with a lug for each lift point.`,
      };
    pairing = pairInOrder(points);
  }
  if (pairing.some((j) => !(j >= 0 && j < beam.dropLugsM.length)) || new Set(pairing).size !== pairing.length)
    return { ok: false, code: "BEAM_LUGS_UNPAIRED", message: "Each lift point needs its own drop lug on the beam." };
  const s = pairing.map((j) => beam.dropLugsM[j]!);
  const first = s.indexOf(Math.min(...s));
  const last = s.indexOf(Math.max(...s));
  const pa = points[first]!.position;
  const pb = points[last]!.position;
  const run = Math.hypot(pb.x - pa.x, pb.y - pa.y);
  if (!(run > 1e-6))
    return {
      ok: false,
      code: "DEGENERATE_LIFT_POINTS",
      message: "The lift points are at one place in plan: a beam needs them apart along its length.",
    };
  const ex = (pb.x - pa.x) / run;
  const ey = (pb.y - pa.y) / run;
  let ox = 0;
  let oy = 0;
  points.forEach((p, i) => {
    ox += p.position.x - s[i]! * ex;
    oy += p.position.y - s[i]! * ey;
  });
  ox /= points.length;
  oy /= points.length;
  const beamZM = Math.max(...points.map((p) => p.position.z)) + dropLengthM;
  const at = (t: number): Vec3 => ({ x: ox + t * ex, y: oy + t * ey, z: beamZM });
  const drops = points.map((p, i) => {
    const lug = at(s[i]!);
    const off = Math.hypot(p.position.x - lug.x, p.position.y - lug.y);
    const lengthV = beamZM - p.position.z;
    const angleFromVerticalDeg = (Math.atan2(off, lengthV) * 180) / Math.PI;
    return {
      liftPointId: p.id,
      lugIndex: pairing[i]!,
      lug,
      lengthM: Math.hypot(off, lengthV),
      angleFromVerticalDeg,
      off,
    };
  });
  const worst = drops.reduce((a, b) => (b.angleFromVerticalDeg > a.angleFromVerticalDeg ? b : a));
  if (worst.angleFromVerticalDeg > DROP_VERTICAL_LIMIT_DEG) {
    const lugGap = Math.abs(s[last]! - s[first]!);
    return {
      ok: false,
      code: "BEAM_DROPS_NOT_VERTICAL",
      message: `The drop to lift point ${worst.liftPointId} would lean ${worst.angleFromVerticalDeg.toFixed(1)}° (its lug is ${mm(worst.off)} from above it; the lugs are ${mm(lugGap)} apart, the lift points ${mm(run)}): drops must hang within ${DROP_VERTICAL_LIMIT_DEG}° of vertical. Use a beam whose lugs sit above the lift points, or longer drops.`,
    };
  }
  return {
    ok: true,
    placement: {
      axis: { x: ex, y: ey, z: 0 },
      endA: at(0),
      endB: at(beam.lengthM),
      drops: drops.map(({ off: _off, ...d }) => d),
      topLugs: beam.topLugsM.map(at),
      cog: at(beam.lengthM / 2),
      beamZM,
    },
  };
}

/** Lugs paired with lift points in order along the line of the points (its longest plan span). */
function pairInOrder(points: ReadonlyArray<{ position: Vec3 }>): number[] {
  let a = 0;
  let b = 0;
  let best = -1;
  points.forEach((p, i) =>
    points.forEach((q, j) => {
      const d = Math.hypot(p.position.x - q.position.x, p.position.y - q.position.y);
      if (d > best) [best, a, b] = [d, i, j];
    }),
  );
  const pa = points[a]!.position;
  const pb = points[b]!.position;
  // End A towards the lower x (then lower y), so the same points give the same pairing every time.
  const flip = pb.x < pa.x - 1e-9 || (Math.abs(pb.x - pa.x) <= 1e-9 && pb.y < pa.y);
  const dx = (flip ? -1 : 1) * (pb.x - pa.x);
  const dy = (flip ? -1 : 1) * (pb.y - pa.y);
  const along = points.map((p, i) => ({ i, t: p.position.x * dx + p.position.y * dy }));
  along.sort((p, q) => p.t - q.t);
  const pairing = new Array<number>(points.length);
  along.forEach((p, rank) => (pairing[p.i] = rank));
  return pairing;
}
