// Checks fed from the geometry: shackle side load and eyebolt eye alignment from the leg's direction,
// and the crane's gross load from every allocated item's own mass.
import { describe, expect, it } from "vitest";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { solveLevel, type LiftPoint } from "./bridle";
import { checkRigging, grossLoads, type RiggingDescription } from "./checks";
import { angleOutOfPlaneDeg, shackleSideLoad } from "./checks-fittings";

const T = REFERENCE_TABLES;
const UP = { x: 0, y: 0, z: 1 };
const sin = (deg: number) => Math.sin((deg * Math.PI) / 180);
const cos = (deg: number) => Math.cos((deg * Math.PI) / 180);

describe("the pull against the plane of an eye or lug (geometry; DEVELOPERS.md model)", () => {
  it("a pull leaning 30 deg toward y is 30 deg out of a plane along x and in a plane along y", () => {
    const pull = { x: 0, y: sin(30), z: cos(30) };
    expect(angleOutOfPlaneDeg(pull, UP, "x")).toBeCloseTo(30, 9);
    expect(angleOutOfPlaneDeg(pull, UP, "y")).toBeCloseTo(0, 9);
  });
  it("an axial pull lies in every plane through the axis", () => {
    expect(angleOutOfPlaneDeg(UP, UP, "x")).toBeCloseTo(0, 12);
  });
  it("a shackle through a collar eyebolt's eye set to face the pull takes no side load", () => {
    const pull = { x: sin(40), y: 0, z: cos(40) };
    expect(shackleSideLoad(pull, UP, undefined, { family: "collar" }, 40)).toEqual({ angleDeg: 0, from: "eye-plane" });
  });
  it("a shackle on an eye the planner fixed along y, pulled 45 deg toward x, is side-loaded 45 deg", () => {
    const pull = { x: sin(45), y: 0, z: cos(45) };
    const side = shackleSideLoad(pull, UP, "y", { family: "collar" }, 45);
    expect(side.angleDeg).toBeCloseTo(45, 9);
  });
  it("a lug with no plane recorded is taken to lie along the pull, and says so", () => {
    expect(shackleSideLoad({ x: 1, y: 0, z: 1 }, UP, undefined, undefined, 45)).toEqual({
      angleDeg: 0,
      from: "lug-assumed",
    });
  });
});

function twoLegs(halfSpanM: number, hookZM: number) {
  const points: LiftPoint[] = [
    { id: "A", position: { x: -halfSpanM, y: 0, z: 0 }, axis: UP },
    { id: "B", position: { x: halfSpanM, y: 0, z: 0 }, axis: UP },
  ];
  const r = solveLevel({ massKg: 1000, cog: { x: 0, y: 0, z: -0.3 } }, points, hookZM);
  if (!r.ok) throw new Error(r.message);
  return r.solution;
}

describe("eyebolts and shackles rated from the geometry", () => {
  // Legs 45 deg from vertical in the x-z plane: each carries 1000 / (2 cos 45) = 707.1 kg.
  const solution = twoLegs(1, 1);
  const lps = [
    { id: "A", thread: "M20", axis: UP },
    { id: "B", thread: "M20", axis: UP },
  ];
  const rigAt = (eyePlane?: "x" | "y"): RiggingDescription => {
    const leg = {
      eyebolt: { family: "collar" as const, thread: "M20" },
      shackle: { type: "bow" as const, wllKg: 2000 },
      ...(eyePlane ? { eyePlane } : {}),
    };
    return { legs: { A: leg, B: leg } };
  };
  it("collar eyebolts set to face the pull: DIN 580 up-to-45 column (860 kg for M20), shackle in line", () => {
    const checks = checkRigging(solution, 1000, { x: 0, y: 0, z: -0.3 }, lps, rigAt(), T);
    const eyebolt = checks.find((c) => c.id === "eyebolt-A")!;
    expect(eyebolt.verdict).toBe("pass");
    expect(eyebolt.capacityKg).toBe(860);
    expect(eyebolt.inputs.eyeAlignment).toBe("set-to-pull");
    expect(checks.find((c) => c.id === "shackle-A")!.inputs).toMatchObject({
      sideLoadAngleDeg: 0,
      sideLoadFrom: "eye-plane",
    });
  });
  it("eyes fixed along y by the planner while the legs pull along x: the eyebolt fails out of plane and the shackle drops to 70 %", () => {
    const checks = checkRigging(solution, 1000, { x: 0, y: 0, z: -0.3 }, lps, rigAt("y"), T);
    const eyebolt = checks.find((c) => c.id === "eyebolt-A")!;
    expect(eyebolt.verdict).toBe("fail");
    expect(eyebolt.finding).toBe("out-of-plane");
    expect(eyebolt.fix).toEqual({ kind: "face-eye-to-pull" });
    const shackle = checks.find((c) => c.id === "shackle-A")!;
    expect(shackle.inputs.sideLoadAngleDeg).toBeCloseTo(45, 6);
    expect(shackle.capacityKg).toBeCloseTo(1400, 9);
  });
  it("eyes fixed along x, in line with the legs, pass as if set to the pull", () => {
    const checks = checkRigging(solution, 1000, { x: 0, y: 0, z: -0.3 }, lps, rigAt("x"), T);
    expect(checks.find((c) => c.id === "eyebolt-A")!.verdict).toBe("pass");
    expect(checks.find((c) => c.id === "eyebolt-A")!.inputs.eyeAlignment).toBe("planner");
  });
});

describe("gross load: load x (1 + contingency) + every allocated item's own mass + beam (ASME P30.1 ch. 5; LOLER reg 8)", () => {
  const rigging: RiggingDescription = {
    contingencyPct: 10,
    legs: {
      A: {
        sling: { kind: "chain", wllKg: 1400, hitch: "straight", itemCode: "CH-2L", massKg: 7.4 },
        eyebolt: { family: "collar", thread: "M20", itemCode: "EB-1", massKg: 0.6 },
      },
      B: {
        sling: { kind: "chain", wllKg: 1400, hitch: "straight", itemCode: "CH-2L", massKg: 7.4 },
        eyebolt: { family: "collar", thread: "M20", itemCode: "EB-2", massKg: 0.6 },
      },
    },
    masterLink: { wllKg: 3150, itemCode: "ML-1", massKg: 2.7 },
    crane: { swlKg: 2000 },
  };
  it("counts a two-leg sling on both legs once, adds the link at the crane, and the beam", () => {
    const loads = grossLoads(1000, rigging, 85);
    expect(loads.masterLink.kg).toBeCloseTo(1100 + 7.4 + 0.6 + 0.6 + 85, 9);
    expect(loads.crane.kg).toBeCloseTo(1100 + 7.4 + 0.6 + 0.6 + 2.7 + 85, 9);
    expect(loads.crane.gross.items.map((i) => i.code)).toEqual(["EB-1", "CH-2L", "EB-2", "ML-1"]);
    expect(loads.crane.gross.unrecorded).toEqual([]);
  });
  it("the crane check carries that gross load and names what it added", () => {
    const checks = checkRigging(
      twoLegs(0.5, 1),
      1000,
      { x: 0, y: 0, z: -0.3 },
      [
        { id: "A", thread: "M20" },
        { id: "B", thread: "M20" },
      ],
      rigging,
      T,
    );
    const crane = checks.find((c) => c.id === "crane-load")!;
    expect(crane.loadKg).toBeCloseTo(1100 + 11.3, 9);
    expect(crane.verdict).toBe("pass");
    expect(crane.inputs.gross?.items).toHaveLength(4);
  });
  it("an item without a recorded mass makes the crane check warn and name it", () => {
    const missing: RiggingDescription = { ...rigging, masterLink: { wllKg: 3150, itemCode: "ML-9" } };
    const checks = checkRigging(
      twoLegs(0.5, 1),
      1000,
      { x: 0, y: 0, z: -0.3 },
      [
        { id: "A", thread: "M20" },
        { id: "B", thread: "M20" },
      ],
      missing,
      T,
    );
    const crane = checks.find((c) => c.id === "crane-load")!;
    expect(crane.verdict).toBe("warn");
    expect(crane.fix).toEqual({ kind: "record-masses", items: ["Master link (ML-9)"] });
    expect(checks.find((c) => c.id === "master-link")!.verdict).toBe("pass");
  });
  it("a lump sum for the rigging stands in for masses not recorded", () => {
    const lump = grossLoads(1000, { ...rigging, masterLink: { wllKg: 3150 }, riggingMassKg: 40 });
    expect(lump.crane.gross.unrecorded).toEqual([]);
    expect(lump.crane.kg).toBeCloseTo(1100 + 8.6 + 40, 9);
  });
});
