import { describe, expect, it } from "vitest";
import { gearItemSchema } from "~/gear/schema";
import { parseLugPositions } from "~/gear/kinds";

const beam = {
  itemCode: "LB-1",
  kind: "beam",
  description: "",
  manufacturer: "",
  serial: "",
  wllValue: "2",
  wllUnit: "t",
  lengthM: "1.2",
  beamMassKg: "45",
  dropLugsM: "1.1, 0.1",
  topLugsM: "0.6",
};

const messages = (input: Record<string, string>) => {
  const r = gearItemSchema.safeParse(input);
  return r.success ? [] : r.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`);
};

describe("a beam's geometry in the register", () => {
  it("reads lug positions as metres from end A and stores them ascending", () => {
    const r = gearItemSchema.safeParse(beam);
    expect(r.success).toBe(true);
    if (!r.success) return;
    expect(r.data.dropLugsM).toBe("0.1, 1.1");
    expect(r.data.topLugsM).toBe("0.6");
    expect(parseLugPositions("0.25; 2.75 3")).toEqual([0.25, 2.75, 3]);
    expect(parseLugPositions("0.25, two")).toBeNull();
  });

  it("refuses a lug beyond the beam's length, naming it", () => {
    expect(messages({ ...beam, dropLugsM: "0.1, 1.3" })).toEqual([
      "dropLugsM: Drop lug at 1.3 m is off the beam: every lug lies from 0 to 1.2 m from end A.",
    ]);
    expect(messages({ ...beam, topLugsM: "-0.1" })[0]).toMatch(/^topLugsM: Top lug at -0.1 m is off the beam/);
  });

  it("needs 2 to 4 drop lugs, apart, and one top lug on a lifting beam, two on a spreader", () => {
    expect(messages({ ...beam, dropLugsM: "0.6" })).toEqual(["dropLugsM: Give from 2 to 4 drop lug positions."]);
    expect(messages({ ...beam, dropLugsM: "0.1, 0.1" })[0]).toMatch(/same place/);
    expect(messages({ ...beam, topLugsM: "0.1, 1.1" })).toEqual([
      "topLugsM: A lifting beam hangs from one top lug: give its one position.",
    ]);
    expect(messages({ ...beam, kind: "spreader", topLugsM: "0.1, 1.1" })).toEqual([]);
    expect(messages({ ...beam, kind: "spreader" })).toEqual([
      "topLugsM: A spreader beam hangs from a 2-leg sling: give its two top lug positions.",
    ]);
  });

  it("needs the geometry, a positive mass and WLL, and says what is missing", () => {
    expect(messages({ ...beam, dropLugsM: "", topLugsM: "" })).toEqual([
      "dropLugsM: Enter the drop lugs for a lifting beam.",
      "topLugsM: Enter the top lugs for a lifting beam.",
    ]);
    expect(messages({ ...beam, dropLugsM: "a, b" })[0]).toMatch(/^dropLugsM: Give the drop lug positions as metres/);
    expect(messages({ ...beam, beamMassKg: "0" })[0]).toMatch(/^beamMassKg: The beam mass must be from 0.1/);
    expect(messages({ ...beam, wllValue: "0" })[0]).toBe("wllValue: The WLL must be more than zero.");
    expect(messages({ ...beam, massKg: "50" })[0]).toMatch(/^massKg: A beam's own mass is its beam mass/);
  });

  it("refuses lug positions on an item that is not a beam", () => {
    expect(
      messages({ ...beam, kind: "shackle", shackleType: "bow", pinType: "bolt", lengthM: "", beamMassKg: "" }),
    ).toEqual([
      "dropLugsM: Drop lugs (m from end) does not apply to a shackle; leave it empty.",
      "topLugsM: Top lugs (m from end) does not apply to a shackle; leave it empty.",
    ]);
  });
});
