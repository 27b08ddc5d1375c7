// Level mode keeps the given-lengths side rule: every leg leaves its lift point outward along the lift
// point's axis, (H - P) . a > 0. A leg that would pull into the part is refused with the code given
// lengths uses (LOAD_TURNS_OVER) and the same words naming the leg.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { solveGivenLengths, solveLevel, type LiftPoint } from "./bridle";
import { GEOMETRY_TOL_M, pullsFromBelowSurface } from "./bridle-types";
import { distance, dot, normalize, sub, type Vec3 } from "./vector";

const RUNS = Number(process.env.STATICS_LAW_RUNS ?? 300);
const load = { massKg: 1000, cog: { x: 0, y: 0, z: 0.4 } };

/** Two lift points on the end faces of a 1.8 m long part, 0.5 m up, with the given axes. */
function endFacePoints(axisA: Vec3, axisB: Vec3): LiftPoint[] {
  return [
    { id: "A", position: { x: -0.9, y: 0, z: 0.5 }, axis: axisA },
    { id: "B", position: { x: 0.9, y: 0, z: 0.5 }, axis: axisB },
  ];
}

describe("level mode: a leg that would pull against its lift point's axis", () => {
  it("eyebolts in the end faces (axes along -x and +x), hook 1.5 m above them: refused as given lengths refuses them", () => {
    // Geometry (common practice): the leg from A (-0.9, 0, 0.5) to the hook (0, 0, 2) runs along (0.9, 0, 1.5);
    // against A's axis (-1, 0, 0) that is acos(-0.9 / 1.749) = 121 deg, past the surface of the end face.
    const points = endFacePoints({ x: -1, y: 0, z: 0 }, { x: 1, y: 0, z: 0 });
    const level = solveLevel(load, points, 2);
    expect(level.ok).toBe(false);
    if (level.ok) return;
    expect(level.code).toBe("LOAD_TURNS_OVER");
    expect(level.message).toContain(pullsFromBelowSurface("A"));
    expect(level.message).toContain("121 deg from its axis");

    const lengths = points.map((p) => distance(p.position, { x: 0, y: 0, z: 2 }));
    const given = solveGivenLengths(load, points, lengths);
    expect(given.ok).toBe(false);
    if (!given.ok) expect(given.code).toBe(level.code);
  });

  it("the same legs from lugs whose axes lean out and up at 45 deg still leave outward: solved, legs 76 deg off their axes", () => {
    const r = Math.SQRT1_2;
    const points = endFacePoints({ x: -r, y: 0, z: r }, { x: r, y: 0, z: r });
    const level = solveLevel(load, points, 2);
    if (!level.ok) throw new Error(`${level.code}: ${level.message}`);
    // Angle between (0.9, 0, 1.5) and (-1, 0, 1)/sqrt 2: acos(0.6 / (sqrt 2 x 1.749)) = 75.96 deg (geometry).
    const expected = (Math.acos(0.6 / (Math.SQRT2 * Math.hypot(0.9, 1.5))) * 180) / Math.PI;
    for (const leg of level.solution.legs) expect(leg.axisAngleDeg).toBeCloseTo(expected, 9);
  });

  it("law: a level solve succeeds only when every leg leaves outward, and a refusal names a leg that does not", () => {
    const coord = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
    const unit = fc
      .record({ x: coord(-1, 1), y: coord(-1, 1), z: coord(-1, 1) })
      .map((v) => normalize(v))
      .filter((v): v is Vec3 => v !== null);
    const rig = fc.integer({ min: 3, max: 4 }).chain((n) =>
      fc.record({
        radii: fc.array(coord(0.3, 2), { minLength: n, maxLength: n }),
        dz: fc.array(coord(0.2, 1.2), { minLength: n, maxLength: n }),
        axes: fc.array(unit, { minLength: n, maxLength: n }),
        base: coord(0, 2 * Math.PI),
        rise: coord(0.3, 3),
      }),
    );
    fc.assert(
      fc.property(rig, (c) => {
        const n = c.radii.length;
        const points: LiftPoint[] = c.radii.map((rad, i) => {
          const phi = c.base + (i * 2 * Math.PI) / n;
          return {
            id: String.fromCharCode(65 + i),
            position: { x: rad * Math.cos(phi), y: rad * Math.sin(phi), z: load.cog.z + c.dz[i]! },
            axis: c.axes[i]!,
          };
        });
        const hookZ = Math.max(...points.map((p) => p.position.z)) + c.rise;
        const hook = { x: load.cog.x, y: load.cog.y, z: hookZ };
        const outward = points.map((p) => dot(sub(hook, p.position), p.axis) > GEOMETRY_TOL_M);
        const level = solveLevel(load, points, hookZ);
        const upright = solveLevel(
          load,
          points.map((p) => ({ ...p, axis: { x: 0, y: 0, z: 1 } })),
          hookZ,
        );
        if (!upright.ok) return; // the geometry fails for other reasons; not this rule's case
        if (outward.every(Boolean)) {
          expect(level.ok).toBe(true);
          return;
        }
        expect(level.ok).toBe(false);
        if (level.ok) return;
        expect(level.code).toBe("LOAD_TURNS_OVER");
        const named = points.findIndex((p) => level.message.includes(pullsFromBelowSurface(p.id)));
        expect(named).toBeGreaterThanOrEqual(0);
        expect(outward[named]).toBe(false);
        // Given lengths keeps every taut leg outward: if it hangs the load level on those lengths, each leg that
        // would pull inward is slack there (a fourth leg can be; it then carries nothing).
        const given = solveGivenLengths(
          load,
          points,
          points.map((p) => distance(p.position, hook)),
        );
        if (given.ok && given.solution.tiltDeg <= 1e-6) {
          for (const [i, p] of points.entries()) {
            if (outward[i]) continue;
            expect(given.solution.legs.find((l) => l.liftPointId === p.id)?.slack, `leg ${p.id} pulls inward`).toBe(
              true,
            );
          }
        }
      }),
      { numRuns: RUNS },
    );
  });
});
