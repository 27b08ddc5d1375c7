// The gear form's typed quantities: every figure goes through the one reader of typed numbers and units
// (utils/numbers.ts, utils/quantities.ts), so "2.5 t", "1 240 kg" and "1.240,5" are understood or refused, never misread.
import { describe, expect, it } from "vitest";
import { gearItemSchema } from "~/gear/schema";

const shackle = { itemCode: "SH-1", kind: "shackle", shackleType: "bow", pinType: "bolt", wllUnit: "t" };

function parse(fields: Record<string, string>) {
  return gearItemSchema.safeParse({ ...shackle, ...fields });
}
function messageFor(fields: Record<string, string>, path: string) {
  return parse(fields).error?.issues.find((i) => i.path.join(".") === path)?.message;
}

describe("the WLL as marked", () => {
  it("reads a bare number in the unit chosen beside it, with a decimal point or comma and grouped digits", () => {
    expect(parse({ wllValue: "2.5" }).data?.wllValue).toBe(2.5);
    expect(parse({ wllValue: "2,5" }).data?.wllValue).toBe(2.5);
    expect(parse({ wllValue: "1 240", wllUnit: "kg" }).data?.wllValue).toBe(1240);
    expect(parse({ wllValue: "1.240,5", wllUnit: "kg" }).data?.wllValue).toBe(1240.5);
    expect(parse({ wllValue: "1,240.5", wllUnit: "kg" }).data?.wllValue).toBe(1240.5);
  });

  it("takes the unit typed after the number when it is the unit chosen: 2.5 t, 1 240 kg, 4 400 lb, 3 US tons", () => {
    expect(parse({ wllValue: "2.5 t" }).data).toMatchObject({ wllValue: 2.5, wllUnit: "t" });
    expect(parse({ wllValue: "2.5t" }).data).toMatchObject({ wllValue: 2.5, wllUnit: "t" });
    expect(parse({ wllValue: "1 240 kg", wllUnit: "kg" }).data).toMatchObject({ wllValue: 1240, wllUnit: "kg" });
    expect(parse({ wllValue: "4 400 lbs", wllUnit: "lb" }).data).toMatchObject({ wllValue: 4400, wllUnit: "lb" });
    expect(parse({ wllValue: "3 US tons", wllUnit: "shortTon" }).data).toMatchObject({ wllValue: 3 });
  });

  it("refuses a unit other than the one chosen, rather than converting the marking", () => {
    expect(messageFor({ wllValue: "2.5 t", wllUnit: "kg" }, "wllValue")).toMatch(/not in kg, the unit chosen/);
    expect(messageFor({ wllValue: "2500 kg" }, "wllValue")).toMatch(/not in t, the unit chosen/);
  });

  it("refuses what could be read two ways, units that are no mass or ambiguous, and figures out of range", () => {
    expect(messageFor({ wllValue: "1,240", wllUnit: "kg" }, "wllValue")).toContain("could mean 1240 or 1.24");
    expect(messageFor({ wllValue: "1.240 kg", wllUnit: "kg" }, "wllValue")).toContain("could mean 1240 or 1.24");
    expect(messageFor({ wllValue: "2 tons" }, "wllValue")).toContain("1000 kg, 907 kg or 1016 kg");
    expect(messageFor({ wllValue: "2 m" }, "wllValue")).toContain("is a unit of length");
    expect(messageFor({ wllValue: "2.5 x" }, "wllValue")).toContain("not a unit of mass");
    expect(messageFor({ wllValue: "" }, "wllValue")).toBe("Enter the WLL marked on the item, as a number.");
    expect(messageFor({ wllValue: "abc" }, "wllValue")).toBe("Enter the WLL marked on the item, as a number.");
    expect(gearItemSchema.safeParse(shackle).error?.issues[0]).toMatchObject({
      path: ["wllValue"],
      message: "Enter the WLL marked on the item, as a number.",
    });
    expect(messageFor({ wllValue: "0" }, "wllValue")).toBe("The WLL must be more than zero.");
    expect(messageFor({ wllValue: "-2" }, "wllValue")).toBe("The WLL must be more than zero.");
    expect(messageFor({ wllValue: "2 000 000", wllUnit: "kg" }, "wllValue")).toContain("beyond anything");
  });

  it("names a mistyped WLL even when another field is wrong too", () => {
    const issues = gearItemSchema.safeParse({ ...shackle, itemCode: "", wllValue: "1,240" }).error?.issues ?? [];
    expect(issues.map((i) => i.path.join("."))).toEqual(expect.arrayContaining(["itemCode", "wllValue"]));
  });
});

describe("the other typed quantities", () => {
  it("reads the item's own mass in kg, or with its unit: 12,5 kg, 0.1 t, 22 lb (0.45359237 kg/lb, NIST SP 811)", () => {
    expect(parse({ wllValue: "2", massKg: "12,5" }).data?.massKg).toBe(12.5);
    expect(parse({ wllValue: "2", massKg: "0.1 t" }).data?.massKg).toBeCloseTo(100, 9);
    expect(parse({ wllValue: "2", massKg: "22 lb" }).data?.massKg).toBeCloseTo(22 * 0.45359237, 9);
    expect(parse({ wllValue: "2", massKg: "" }).data?.massKg).toBeNull();
    expect(messageFor({ wllValue: "2", massKg: "1,240" }, "massKg")).toContain("could mean 1240 or 1.24");
    expect(messageFor({ wllValue: "2", massKg: "200 t" }, "massKg")).toBe(
      "The item's own mass must be from 0 to 100000.",
    );
  });

  it("reads sizes in their units or converted: a sling's diameter in mm or in, its length in m or mm", () => {
    const sling = { itemCode: "CS-1", kind: "chain_sling", wllValue: "2", chainGrade: "8", legs: "2" };
    const read = (fields: Record<string, string>) => gearItemSchema.safeParse({ ...sling, wllUnit: "t", ...fields });
    expect(read({ diameterMm: "8", lengthM: "2,5" }).data).toMatchObject({ diameterMm: 8, lengthM: 2.5 });
    expect(read({ diameterMm: "0.5 in", lengthM: "2 500 mm" }).data).toMatchObject({ diameterMm: 12.7, lengthM: 2.5 });
    expect(read({ diameterMm: "8 kg" }).error?.issues[0]?.message).toContain("is a unit of mass");
  });
});
