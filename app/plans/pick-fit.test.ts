// The gear picker's fit note and the plan's check agree: the note is the check of the item in that
// position (an eyebolt at its derated capacity for the pull's angle, DIN 580 columns).
import { describe, expect, it } from "vitest";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { fitNotes } from "~/components/gear-picker";
import { judgePick } from "~/plans/pick-fit";
import { assembleRigging, type GearPick } from "~/plans/rigging";
import { handleSolve } from "~/statics/api";

const eyebolt: GearPick = {
  id: 7,
  itemCode: "EB-16",
  role: "eyebolt",
  description: "Collar eyebolt, M16",
  wllKg: 700,
  thread: "M16",
  lengthM: null,
  status: "in_service",
  nextDueOn: "2099-01-01",
  massKg: null,
  spec: {
    role: "eyebolt",
    eyebolt: { family: "collar", thread: "M16", wll: { value: 700, unit: "kg" }, itemCode: "EB-16" },
  },
};

function body(hookZM: number, withEyebolt: boolean) {
  const allocation = {
    legs: {
      A: withEyebolt ? { hitch: "straight" as const, eyeboltItemId: 7 } : { hitch: "straight" as const },
      B: { hitch: "straight" as const },
    },
  };
  return {
    load: { massKg: 1000, cog: { x: 0, y: 0, z: -0.2 } },
    liftPoints: [
      { id: "A", x: -0.8, y: 0, z: 0, thread: "M16" },
      { id: "B", x: 0.8, y: 0, z: 0, thread: "M16" },
    ],
    hook: { z: hookZM },
    rigging: assembleRigging(allocation, new Map([[7, eyebolt]]), { contingencyPct: 10 }),
    ruleSet: "uk-eu",
  };
}

describe("the picker's fit note is the plan's check", () => {
  it("an M16 collar eyebolt marked 700 kg on a leg 30 deg out carries 1,100 / 2 / cos 30 = 635.1 kg (636 kg rounded up) against DIN 580's 500 kg: both say no", () => {
    // Hook at 0.8 / tan 30 deg = 1.386 m: legs 30 deg from vertical (hand-computed).
    const hookZ = 0.8 / Math.tan(Math.PI / 6);
    const judged = judgePick(body(hookZ, false), { role: "eyebolt", legId: "A" }, eyebolt, REFERENCE_TABLES);
    expect(judged?.capacityKg).toBe(500);
    expect(judged?.loadKg).toBeCloseTo(1100 / 2 / Math.cos(Math.PI / 6), 6);
    expect(judged?.verdict).toBe("fail");
    const note = fitNotes(eyebolt, "M16", 577, "metric", judged);
    expect(note.some((n) => n.bad && /below the 636 kg design load/.test(n.text))).toBe(true);
    // The marked WLL alone (700 kg against the 577 kg elastic share) would have said it fits.
    expect(fitNotes(eyebolt, "M16", 577, "metric").every((n) => !n.bad)).toBe(true);
  });
  it.each([0.3, 0.6, 1, 1.5, 2.5, 4])(
    "with the hook at %s m the note's verdict and capacity are the allocated check's",
    (z) => {
      const judged = judgePick(body(z, false), { role: "eyebolt", legId: "A" }, eyebolt, REFERENCE_TABLES);
      const planned = handleSolve(body(z, true), REFERENCE_TABLES);
      if (planned.status !== 200) throw new Error("solve failed");
      const check = planned.body.checks!.find((c) => c.id === "eyebolt-A")!;
      expect(judged?.verdict).toBe(check.verdict);
      expect(judged?.capacityKg).toBe(check.capacityKg);
      expect(judged?.loadKg).toBe(check.loadKg);
    },
  );
});

describe("an allocated item's note can be read from the plan's own solve", () => {
  it.each([0.3, 1, 2.5])(
    "with the hook at %s m the allocated eyebolt's check in the plan's solve is judgePick's, field for field",
    (z) => {
      // The plan's rigging carries the item's inspection record; judgePick puts in the bare register spec.
      // The inspection is judged apart from the position's rating, so the position's check is the same either way.
      const planned = handleSolve(body(z, true), REFERENCE_TABLES);
      if (planned.status !== 200) throw new Error("solve failed");
      expect(body(z, true).rigging.legs?.A?.eyebolt?.inspection).toBeDefined();
      const judged = judgePick(body(z, true), { role: "eyebolt", legId: "A" }, eyebolt, REFERENCE_TABLES);
      expect(judged).not.toBeNull();
      expect(planned.body.checks!.find((c) => c.id === "eyebolt-A")).toEqual(judged);
    },
  );
});
