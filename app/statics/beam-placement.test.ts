import { describe, expect, it } from "vitest";
import { solveBeamLift } from "./beam";
import { placeBeam } from "./beam-placement";
import type { LiftPoint } from "./bridle";

const lp = (id: string, x: number, y: number, z: number): LiftPoint => ({
  id,
  position: { x, y, z },
  axis: { x: 0, y: 0, z: 1 },
});

// The Furley Engineering "Sling Load" example (CHECK-VALUES.md): 2000 kg, lift points 800 mm and 200 mm
// either side of the CoG, level. Here on vertical drops from a register beam 1.2 m long with drop lugs at
// 0.1 m and 1.1 m (1.0 m apart, as the lift points) and its own mass 100 kg at mid-length.
const load = { massKg: 2000, cog: { x: 0, y: 0, z: -0.5 } };
const points = [lp("far", 0.8, 0, 0), lp("near", -0.2, 0, 0)];
const beamMassKg = 100;
// Mid-length sits 0.3 m from the CoG's plumb line, so beam and load balance 100 * 0.3 / 2100 m from it.
const balanceS = 0.3 + (beamMassKg * 0.3) / (load.massKg + beamMassKg);

describe("a beam from the register placed over the lift points", () => {
  it("puts each drop lug above its lift point, end A towards the lower x, the beam level at the drops' top", () => {
    const r = placeBeam({ lengthM: 1.2, dropLugsM: [0.1, 1.1], topLugsM: [0.6] }, points, 0.5);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const p = r.placement;
    expect(p.endA).toEqual({ x: expect.closeTo(-0.3, 12), y: expect.closeTo(0, 12), z: 0.5 });
    expect(p.endB).toEqual({ x: expect.closeTo(0.9, 12), y: expect.closeTo(0, 12), z: 0.5 });
    expect(p.drops.map((d) => [d.liftPointId, d.lugIndex])).toEqual([
      ["far", 1],
      ["near", 0],
    ]);
    expect(p.drops.every((d) => d.angleFromVerticalDeg < 1e-9 && Math.abs(d.lengthM - 0.5) < 1e-12)).toBe(true);
    expect(p.cog.x).toBeCloseTo(0.3, 12);
    expect(p.topLugs[0]!.x).toBeCloseTo(0.3, 12);
  });

  it("refuses lugs that would make the drops lean over 5 deg (29 CFR 1910.184(b): within 5 deg counts as vertical)", () => {
    // Lugs 0.6 m apart over points 1.0 m apart: each drop 0.2 m off plumb on 0.5 m, atan(0.4) = 21.8 deg.
    const r = placeBeam({ lengthM: 1.2, dropLugsM: [0.3, 0.9], topLugsM: [0.6] }, points, 0.5);
    expect(r).toMatchObject({ ok: false, code: "BEAM_DROPS_NOT_VERTICAL" });
    if (r.ok) return;
    expect(r.message).toContain("21.8°");
  });

  it("refuses a beam with fewer lugs than lift points, saying so", () => {
    const r = placeBeam({ lengthM: 1.2, dropLugsM: [0.1, 0.6, 1.1], topLugsM: [0.6] }, points, 0.5);
    expect(r).toMatchObject({ ok: false, code: "BEAM_LUGS_UNPAIRED" });
  });
});

describe("the beam solve fed from a register item", () => {
  const place = (topLugsM: number[]) => {
    const r = placeBeam({ lengthM: 1.2, dropLugsM: [0.1, 1.1], topLugsM }, points, 0.5);
    if (!r.ok) throw new Error(r.message);
    return r.placement;
  };

  it("drops share 400 / 1600 kg by the lever rule (Furley 'Sling Load' vertical shares); the hook carries load + beam", () => {
    const p = place([balanceS]);
    const r = solveBeamLift(
      load.massKg,
      load.cog,
      points,
      { massKg: beamMassKg, cog: p.cog, topLugs: p.topLugs },
      1.5,
      p.drops.map((d) => d.lengthM),
    );
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.solution.drops.drops.map((d) => d.tensionKg)).toEqual([expect.closeTo(400, 9), expect.closeTo(1600, 9)]);
    expect(r.solution.hookMassKg).toBe(2100);
    expect(r.solution.top.legs[0]!.tensionKg).toBeCloseTo(2100, 9);
    expect(r.solution.warnings.map((w) => w.code)).not.toContain("BEAM_TILTS");
  });

  it("refuses a single top lug far from above the CoG of beam and load: they would hang out of level (common practice)", () => {
    // Lug at mid-length, 0.2857 m off the balance point, 0.952 m above the combined CoG: about 16.7 deg.
    const p = place([0.6]);
    const r = solveBeamLift(load.massKg, load.cog, points, { massKg: beamMassKg, cog: p.cog, topLugs: p.topLugs }, 1.5);
    expect(r).toMatchObject({ ok: false, code: "BEAM_NOT_BALANCED" });
    if (r.ok) return;
    expect(r.message).toMatch(/16\.\d°/);
  });

  it("a spreader on two top lugs: the top legs share load + beam by the lever rule about the combined CoG (common practice)", () => {
    const p = place([0.1, 1.1]);
    const r = solveBeamLift(load.massKg, load.cog, points, { massKg: beamMassKg, cog: p.cog, topLugs: p.topLugs }, 1.5);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    // Combined CoG at x = 30/2100 m; lugs at x = -0.2 and 0.8: the near lug carries (0.8 - x) / 1.0 of 2100 kg.
    const x = 30 / 2100;
    const vertical = r.solution.top.legs.map((l) => l.tensionKg * Math.cos((l.angleFromVerticalDeg * Math.PI) / 180));
    const near = r.solution.top.legs.findIndex((l) => l.liftPointId === "lug 1");
    expect(vertical[near]).toBeCloseTo(2100 * (0.8 - x), 6);
    expect(vertical[1 - near]).toBeCloseTo(2100 * (x + 0.2), 6);
  });
});
