import { describe, expect, it } from "vitest";
import { REFERENCE_TABLES } from "../../db/seeders/reference-data";
import { cellText, columnLabel, HEADINGS } from "~/components/reference-headings";

describe("the reference tables' headings", () => {
  it("give every column of every table a heading a rigger reads, with units, never a field name", () => {
    for (const [table, rows] of Object.entries(REFERENCE_TABLES)) {
      for (const row of rows as ReadonlyArray<Record<string, unknown>>) {
        for (const key of Object.keys(row)) {
          if (key === "source") continue;
          expect(HEADINGS[key], `${table}.${key} has no heading`).toBeDefined();
        }
      }
    }
    expect(columnLabel("upTo45Kg")).toBe("Up to 45° from the axis (kg)");
    expect(columnLabel("twoLeg45To60T")).toBe("2 legs, β 45–60° (t)");
  });
  it("write flags and units in words", () => {
    expect(cellText("andAbove", "true")).toBe("and above");
    expect(cellText("andAbove", "false")).toBe("exactly");
    expect(cellText("unit", "shortTon")).toBe("US short tons");
  });
});
